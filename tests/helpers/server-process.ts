import { spawn, type ChildProcess } from 'node:child_process';
import { symlinkSync } from 'node:fs';
import { createServer } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import request from 'supertest';
import { sessionCookie } from './api';

/**
 * The real server as a child process (`server/index.ts` under tsx) on a SQLite file in `dir`, for tests that kill
 * it. `ready` resolves once it prints that it is serving; `exited` when the process has gone, however it went.
 */
export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

/**
 * The standby entry (tests/helpers/server-standby.ts) and the server under it bundled by esbuild, the
 * transformer tsx runs on, into one file in `outDir`; packages stay outside and load from the repository's
 * node_modules. Loading it costs about half the CPU of tsx transforming the server's files at every start,
 * which counts when a test starts the server twenty times. Returns the file to pass as `entry`.
 */
export async function bundleServer(outDir: string): Promise<string> {
  const { build } = await import('esbuild');
  const outfile = path.join(outDir, 'server-standby.mjs');
  await build({
    entryPoints: [path.join(repoRoot, 'tests/helpers/server-standby.ts')],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    outfile,
    logLevel: 'error',
  });
  symlinkSync(path.join(repoRoot, 'node_modules'), path.join(outDir, 'node_modules'), 'dir');
  return outfile;
}

export interface ServerProcess {
  child: ChildProcess;
  /** For a standby process: start the server now (it opens the database only then). */
  go(): void;
  ready: Promise<void>;
  exited: Promise<void>;
  /** A standby process has loaded the server's modules (resolves at once otherwise). */
  loaded: Promise<void>;
  /** Everything the process printed so far (stdout and stderr). */
  output(): string;
}

/**
 * `standby: true` loads the server's modules now and starts the server at `go()` (tests/helpers/server-standby.ts),
 * so a restart costs the start-up itself, not the module loading; `ready` then waits for `go()` as well.
 * `entry`: a standby bundle from bundleServer, run by plain node.
 */
export function startServer(dir: string, port: number, env: Record<string, string> = {}, options: { standby?: boolean; entry?: string } = {}): ServerProcess {
  const entry = options.entry ?? path.join(repoRoot, options.standby ? 'tests/helpers/server-standby.ts' : 'server/index.ts');
  const child = spawn(process.execPath, options.entry ? [entry] : ['--import', 'tsx', entry], {
    cwd: repoRoot,
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      HOLDFIRE_DATA_DIR: dir,
      DATABASE_URL: `sqlite:${path.join(dir, 'holdfire.sqlite')}`,
      HOLDFIRE_SEED: 'demo',
      NODE_ENV: 'test',
      APP_URL: `http://127.0.0.1:${port}`,
      ...env,
    },
    stdio: [options.standby ? 'pipe' : 'ignore', 'pipe', 'pipe'],
  });
  let out = '';
  let markLoaded = () => {};
  const loaded = options.standby ? new Promise<void>((resolve) => (markLoaded = resolve)) : Promise.resolve();
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const ready = new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start: ${out}`)), 60_000);
    const seen = (chunk: Buffer) => {
      out += chunk.toString();
      if (out.includes('standby: modules loaded')) markLoaded();
      if (out.includes('Holdfire is serving')) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', seen);
    child.stderr!.on('data', seen);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server exited (${code}): ${out}`));
    });
  });
  // A rejection nobody waits for (the process killed on purpose after it was ready) is not an error.
  ready.catch(() => {});
  return { child, ready, exited, loaded, output: () => out, go: () => void child.stdin?.write('go\n') };
}

/** SIGKILL, and wait until the process is gone. */
export async function killServer(server: ServerProcess): Promise<void> {
  if (server.child.exitCode === null && server.child.signalCode === null) server.child.kill('SIGKILL');
  await server.exited;
}

/** A signed-in supertest agent against a server at `base`, with its session cookie and a CSRF token. */
export async function signIn(base: string, email: string, password = 'kestrel-demo') {
  const agent = request.agent(base);
  let csrf = (await agent.get('/api/auth/csrf').expect(200)).body.csrfToken as string;
  const res = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email, password }).expect(200);
  const cookie = sessionCookie(res);
  if (!cookie) throw new Error('login set no session cookie');
  csrf = (await agent.get('/api/auth/csrf').expect(200)).body.csrfToken;
  return {
    agent,
    cookie,
    post: (url: string, body: object) => agent.post(url).set('X-CSRF-Token', csrf).send(body),
    get: (url: string) => agent.get(url),
  };
}
