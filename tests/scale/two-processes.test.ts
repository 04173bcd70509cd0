import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, sessionCookie } from '../helpers/api';
import { createTestDatabase, onPostgres } from '../helpers/app';
import { connected, demoRevision, eventRecorder, openSocket, releasedTinyProcedure } from '../helpers/counts';
import type { TestClient } from '../helpers/app';

/**
 * Two real Holdfire processes on one PostgreSQL database, sharing socket.io rooms through a real redis-server
 * (npm run test:scale starts both). People reach either process, as behind a proxy: a station on process A and
 * the conductor on process B run a poll and a hold, and answers sent to both processes at the same moment
 * leave one unforked hash chain.
 */
const REDIS_URL = process.env.REDIS_URL;
const ready = onPostgres && REDIS_URL !== undefined;

interface Proc {
  url: string;
  child: ChildProcess;
  output: string[];
}

let dataDir: string;
let database: Awaited<ReturnType<typeof createTestDatabase>>;
let a: Proc;
let b: Proc;
const sockets: Socket[] = [];

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

async function startProcess(seed: 'demo' | 'none'): Promise<Proc> {
  const port = await freePort();
  const output: string[] = [];
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: {
      ...process.env,
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: database.url,
      REDIS_URL,
      HOLDFIRE_DATA_DIR: dataDir,
      HOLDFIRE_SEED: seed,
      NODE_ENV: 'test',
      // Both processes must sign the same session cookies (they share the data dir's secret file as well).
      SESSION_SECRET: 'scale-test-secret-for-the-marsh-end-site-0123456789',
      APP_URL: `http://127.0.0.1:${port}`,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d: Buffer) => output.push(d.toString()));
  child.stderr!.on('data', (d: Buffer) => output.push(d.toString()));
  const url = `http://127.0.0.1:${port}`;
  const until = Date.now() + 90_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`Holdfire exited (${child.exitCode}):\n${output.join('')}`);
    const ok = await fetch(`${url}/api/health`).then((r) => r.ok, () => false);
    if (ok) return { url, child, output };
    if (Date.now() > until) throw new Error(`Holdfire did not start:\n${output.join('')}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

async function stopProcess(p: Proc | undefined): Promise<void> {
  if (!p || p.child.exitCode !== null) return;
  const exited = new Promise((resolve) => p.child.once('exit', resolve));
  p.child.kill('SIGTERM');
  const timer = setTimeout(() => p.child.kill('SIGKILL'), 10_000);
  await exited;
  clearTimeout(timer);
}

/** A signed-in HTTP client of one process, and its session cookie for sockets (valid on both). */
async function signIn(p: Proc, email: string): Promise<{ http: TestClient; cookie: string }> {
  const agent = request.agent(p.url);
  const http: TestClient = {
    agent,
    csrf: '',
    async refreshCsrf() {
      http.csrf = (await agent.get('/api/auth/csrf').expect(200)).body.csrfToken;
      return http.csrf;
    },
    post: (u, body = {}) => agent.post(u).set('X-CSRF-Token', http.csrf).send(body),
    patch: (u, body = {}) => agent.patch(u).set('X-CSRF-Token', http.csrf).send(body),
    get: (u) => agent.get(u),
  };
  await http.refreshCsrf();
  const res = await http.post('/api/auth/login', { email, password: 'kestrel-demo' }).expect(200);
  await http.refreshCsrf();
  return { http, cookie: sessionCookie(res)! };
}

async function person(p: Proc, email: string, countId: number) {
  const { cookie } = await signIn(p, email);
  const socket = openSocket(p.url, cookie);
  sockets.push(socket);
  await connected(socket);
  const events = eventRecorder(socket);
  const joined = await socket.timeout(5000).emitWithAck('count:join', { countId, sinceSeq: 0 });
  if (!joined.data) throw new Error(`join: ${joined.error}`);
  return { socket, events, joined: joined.data as { events: { seq: number; type: string }[]; state: Record<string, unknown> } };
}

type Reply = { data?: { events: { type: string; payload: Record<string, unknown>; seq: number }[] }; error?: string };
const send = (s: Socket, countId: number, command: object): Promise<Reply> =>
  s.timeout(10_000).emitWithAck('count:command', { countId, command: command as never });

beforeAll(async () => {
  if (!ready) return;
  dataDir = mkdtempSync(path.join(tmpdir(), 'holdfire-scale-'));
  database = await createTestDatabase();
  // Both at once, both asked to seed, as a process manager would start them: the start-up lock makes one migrate
  // and seed and the other find it done.
  [a, b] = await Promise.all([startProcess('demo'), startProcess('demo')]);
});
afterEach(() => {
  for (const s of sockets.splice(0)) s.disconnect();
});
afterAll(async () => {
  if (!ready) return;
  await Promise.all([stopProcess(a), stopProcess(b)]);
  await database?.drop();
  rmSync(dataDir, { recursive: true, force: true });
});

/** A new count of the demo procedure, made by the conductor through `p`, started, with TC on B and PROP, PAD on A. */
async function countAcrossProcesses() {
  const { http } = await signIn(b, DEMO.conductor);
  const rev = await demoRevision(http);
  const id = (await http.post('/api/counts', { ...rev, name: `Marsh End two-process run ${Date.now()}` }).expect(201)).body.id as number;
  const tc = await person(b, DEMO.conductor, id);
  const prop = await person(a, DEMO.propellants, id);
  const pad = await person(a, DEMO.pad, id);
  // Presence logged by A reaches the conductor's socket on B through the adapter.
  await tc.events.waitFor((e) => e.type === 'station:connected' && e.payload.station === 'PAD');
  await tc.events.waitFor((e) => e.type === 'station:connected' && e.payload.station === 'PROP');
  const started = await send(tc.socket, id, { type: 'count:start' });
  expect(started.error).toBeUndefined();
  return { id, http, tc, prop, pad };
}

/** The log as each process serves it: the same events, a chain that verifies, seqs 1..n without gaps. */
async function expectOneChain(id: number) {
  const viaA = (await signIn(a, DEMO.auditor)).http;
  const viaB = (await signIn(b, DEMO.auditor)).http;
  const [eventsA, eventsB] = await Promise.all([viaA.get(`/api/counts/${id}/events`).expect(200), viaB.get(`/api/counts/${id}/events`).expect(200)]);
  expect(eventsA.body).toEqual(eventsB.body);
  const seqs = (eventsA.body as { seq: number }[]).map((e) => e.seq);
  expect(seqs).toEqual(seqs.map((_, i) => i + 1));
  for (const c of [viaA, viaB]) {
    const verdict = (await c.get(`/api/counts/${id}/verify`).expect(200)).body;
    expect(verdict).toMatchObject({ ok: true, count: seqs.length });
  }
  return { events: eventsA.body as { seq: number; type: string; payload: Record<string, unknown> }[], viaA, viaB };
}

describe.skipIf(!ready)('two processes behind the Redis adapter', () => {
  it('a poll opened by the conductor on B is answered by stations on A; everyone sees the same close', async () => {
    const { id, tc, prop, pad } = await countAcrossProcesses();
    const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], question: 'Go for LOX loading?', timeoutSeconds: 120 });
    const pollId = opened.data!.events[0]!.payload.pollId as string;
    await prop.events.waitFor((e) => e.type === 'poll:opened' && e.payload.pollId === pollId);

    // A decides on B's poll: it folds B's events in under the count's lock before deciding.
    const first = await send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' });
    expect(first.data?.events.map((e) => e.type)).toEqual(['poll:answered']);
    const last = await send(pad.socket, id, { type: 'poll:answer', pollId, station: 'PAD', answer: 'go' });
    expect(last.data?.events.map((e) => e.type)).toEqual(['poll:answered', 'poll:closed']);
    for (const p of [tc, prop, pad]) {
      const closed = await p.events.waitFor((e) => e.type === 'poll:closed');
      expect(closed.payload).toMatchObject({ pollId, result: 'go', nogo: [], missing: [] });
    }
    // The conductor's process serves the state A's events made (it catches up before serving).
    const { viaB, viaA } = await expectOneChain(id);
    for (const c of [viaA, viaB]) {
      const state = (await c.get(`/api/counts/${id}/state`).expect(200)).body;
      expect(state.poll).toBeNull();
      expect(state.polls.at(-1)).toMatchObject({ pollId, result: 'go' });
    }
  });

  it('a hold called on A stops the clock for the conductor on B; resume waits for the clear', async () => {
    const { id, tc, prop, pad } = await countAcrossProcesses();
    const called = await send(prop.socket, id, { type: 'hold:call', category: 'hardware', reason: 'Igniter continuity reads open on Kestrel-2' });
    const holdId = called.data!.events[0]!.payload.holdId as string;
    const seen = await tc.events.waitFor((e) => e.type === 'hold:called');
    expect(seen.payload).toMatchObject({ holdId, calledByStation: 'PROP' });
    // B refuses on A's hold, which it has not served to anyone yet when the command arrives.
    expect((await send(tc.socket, id, { type: 'count:resume' })).error).toMatch(/Clear every hold first/);
    expect((await send(prop.socket, id, { type: 'hold:clear', holdId })).error).toBeUndefined();
    expect((await send(tc.socket, id, { type: 'count:resume' })).error).toBeUndefined();
    await pad.events.waitFor((e) => e.type === 'count:resumed');
    await expectOneChain(id);
  });

  it('answers sent to both processes at the same moment close each poll exactly once, on one chain', async () => {
    const { id, tc, prop } = await countAcrossProcesses();
    // PAD's operator is on B this time: the two answers of each poll race on two processes.
    const padOnB = await person(b, DEMO.pad, id);
    for (let round = 0; round < 5; round++) {
      const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], question: `Round ${round}: go?`, timeoutSeconds: 120 });
      const pollId = opened.data!.events[0]!.payload.pollId as string;
      await prop.events.waitFor((e) => e.type === 'poll:opened' && e.payload.pollId === pollId);
      await padOnB.events.waitFor((e) => e.type === 'poll:opened' && e.payload.pollId === pollId);
      const answers = await Promise.all([
        send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' }),
        send(padOnB.socket, id, { type: 'poll:answer', pollId, station: 'PAD', answer: 'go' }),
      ]);
      const types = answers.map((r) => r.data?.events.map((e) => e.type));
      // Whichever process came second under the lock saw the first answer and closed the poll.
      expect(types.filter((t) => t?.join() === 'poll:answered')).toHaveLength(1);
      expect(types.filter((t) => t?.join() === 'poll:answered,poll:closed')).toHaveLength(1);
    }
    const { events } = await expectOneChain(id);
    expect(events.filter((e) => e.type === 'poll:closed')).toHaveLength(5);
  });

  it('a poll time-out due on both processes is logged once', async () => {
    const { id, tc, prop } = await countAcrossProcesses();
    // Both processes hold the count in memory, so both run the clock's timer for the time-out.
    const opened = await send(tc.socket, id, { type: 'poll:open', stations: ['PROP', 'PAD'], question: 'Go for chill-down?', timeoutSeconds: 5 });
    const pollId = opened.data!.events[0]!.payload.pollId as string;
    await send(prop.socket, id, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' });
    const closed = await tc.events.waitFor((e) => e.type === 'poll:closed' && e.payload.pollId === pollId, 15_000);
    expect(closed.payload).toMatchObject({ pollId, missing: ['PAD'] });
    // Give the later timer time to fire and find nothing due.
    await new Promise((r) => setTimeout(r, 1500));
    const { events } = await expectOneChain(id);
    expect(events.filter((e) => e.type === 'poll:closed' && e.payload.pollId === pollId)).toHaveLength(1);
  });
  // Last: it stops process A.
  it('the clock goes on in B when A, which started the count, stops: B folded A’s events as they were announced', async () => {
    const conductor = (await signIn(b, DEMO.conductor)).http;
    const safety = (await signIn(b, DEMO.safety)).http;
    const rev = await releasedTinyProcedure(conductor, safety, `Kestrel-2 chill test ${Date.now()}`);
    const id = (await conductor.post('/api/counts', { ...rev, name: 'Started on A' }).expect(201)).body.id as number;
    // B holds the count in memory (the conductor watches there); the start is decided and logged by A.
    const watcher = await person(b, DEMO.conductor, id);
    const onA = (await signIn(a, DEMO.conductor)).http;
    await onA.post(`/api/counts/${id}/commands`, { type: 'count:start' }).expect(200);
    await watcher.events.waitFor((e) => e.type === 'count:started');
    await stopProcess(a);
    // T-3 to T-0 in three seconds: only B's timer is left to log the steps, and it has one only if B's copy of
    // the count knows the clock is running.
    const t0 = await watcher.events.waitFor((e) => e.type === 't0:reached', 15_000);
    expect(t0.seq).toBeGreaterThan(0);
    const events = (await conductor.get(`/api/counts/${id}/events`).expect(200)).body as { seq: number; type: string }[];
    expect(events.map((e) => e.seq)).toEqual(events.map((_, i) => i + 1));
    expect(events.filter((e) => e.type === 't0:reached')).toHaveLength(1);
    expect((await conductor.get(`/api/counts/${id}/verify`).expect(200)).body).toMatchObject({ ok: true });
  });
});
