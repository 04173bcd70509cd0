/**
 * What the bench's parts share: the child processes and their IPC, HTTP with a real session, the long-lead
 * procedure, the conductor's socket.io client, and the statistics. `startStack` starts the server process and the
 * two station processes, makes the bench stations and operators and signs everyone in (see bench/README.md).
 */
import { fork, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { io as connect } from 'socket.io-client';
import type { CountEventDto } from '../src/contract/count';
import type { BenchStation, FromServer, FromStations, MessageSizes, ToServer, ToStations } from './protocol';

export const POLL_LIMIT_MS = 30_000;
export const STATION_PROCESSES = 2;
const DEMO_PASSWORD = 'kestrel-demo';

const here = path.dirname(fileURLToPath(import.meta.url));
export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export function withLimit<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: NodeJS.Timeout;
  return Promise.race([p, new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error(`${what}: nothing after ${ms} ms`)), ms)))]).finally(() =>
    clearTimeout(timer),
  );
}



/** The next message of `type` from the child (an 'error' message rejects). */
export function next<M extends { type: string }, T extends M['type']>(child: ChildProcess, type: T, ms = 120_000): Promise<Extract<M, { type: T }>> {
  return withLimit(
    new Promise((resolve, reject) => {
      const on = (m: M) => {
        if (m.type !== type && m.type !== 'error') return;
        child.off('message', on);
        if (m.type === 'error') reject(new Error(`child ${child.pid}: ${(m as unknown as { message: string }).message}`));
        else resolve(m as Extract<M, { type: T }>);
      };
      child.on('message', on);
    }),
    ms,
    `waiting for ${type} from child ${child.pid}`,
  );
}
export function askServer<T extends FromServer['type']>(server: ChildProcess, m: ToServer, type: T) {
  const answer = next<FromServer, T>(server, type);
  server.send(m);
  return answer;
}
export function askStations<T extends FromStations['type']>(children: ChildProcess[], messages: ToStations[], type: T) {
  return Promise.all(
    children.map((c, i) => {
      const answer = next<FromStations, T>(c, type);
      c.send(messages[i] ?? messages[0]!);
      return answer;
    }),
  );
}

// ---------------------------------------------------------------- HTTP with a real session

export interface Session {
  cookie: string;
  csrf: string;
}

export function sidFrom(res: Response, fallback = ''): string {
  const line = res.headers.getSetCookie().find((c) => c.startsWith('holdfire.sid='));
  return line ? line.split(';')[0]! : fallback;
}

export async function csrfFor(base: string, cookie: string): Promise<Session> {
  const res = await fetch(`${base}/api/auth/csrf`, { headers: cookie ? { cookie } : {} });
  if (!res.ok) throw new Error(`csrf: ${res.status}`);
  const body = (await res.json()) as { csrfToken: string };
  return { cookie: sidFrom(res, cookie), csrf: body.csrfToken };
}

export async function call(base: string, s: Session, method: string, url: string, body: object = {}) {
  const res = await fetch(`${base}${url}`, {
    method,
    headers: { cookie: s.cookie, 'x-csrf-token': s.csrf, 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });
  const json = (await res.json().catch(() => null)) as Record<string, unknown> | null;
  if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${JSON.stringify(json)}`);
  return { res, json: json! };
}

export async function signIn(base: string, email: string, password: string): Promise<Session> {
  const anonymous = await csrfFor(base, '');
  const { res } = await call(base, anonymous, 'POST', '/api/auth/login', { email, password });
  return csrfFor(base, sidFrom(res, anonymous.cookie));
}

/** A released procedure whose only steps are T-10 h (reached at the start) and T-0: the clock never gets in the way. */
export async function longLeadProcedure(base: string, conductor: Session, safety: Session) {
  const { json: p } = await call(base, conductor, 'POST', '/api/procedures', {
    name: 'Bench: long lead count',
    purpose: 'Poll round-trip benchmark; nothing is fired.',
    testArticle: 'Kestrel-2',
    site: 'Marsh End test site',
  });
  const content = {
    phases: [
      {
        name: 'Long lead',
        steps: [
          { kind: 'action', tSeconds: -36_000, station: 'TC', instruction: 'Open the bench log.' },
          { kind: 'action', tSeconds: 0, station: 'TC', instruction: 'Close the bench log.' },
        ],
      },
    ],
  };
  await call(base, conductor, 'PUT', `/api/procedures/${p.id}/revisions/1`, content);
  await call(base, conductor, 'POST', `/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'conductor' });
  const { json: rev } = await call(base, safety, 'POST', `/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'safety' });
  return { procedureId: p.id as number, revisionId: rev.id as number };
}

// ---------------------------------------------------------------- the conductor's two clients

export type Ack = { data?: { events: CountEventDto[] }; error?: string };

export interface Seqs {
  last: number;
  lost: number;
  duplicated: number;
}

export function conductorSocket(url: string, cookie: string, countId: number, n: number) {
  const socket = connect(url, { transports: ['websocket'], reconnection: false, forceNew: true, timeout: 10_000, extraHeaders: { cookie } });
  const seqs: Seqs = { last: -1, lost: 0, duplicated: 0 };
  let connectedStations = 0;
  let current: { pollId: string | null; answered: number; resolve: (at: number) => void; reject: (e: Error) => void; at: number | null } | null = null;
  const sizes: Partial<MessageSizes> = {};
  let missingAnswers = 0;
  let pollOpenedSeq = -1;

  socket.on('count:events', (list: CountEventDto[]) => list.forEach(onEvent));
  function onEvent(e: CountEventDto) {
    if (seqs.last >= 0) {
      if (e.seq <= seqs.last) seqs.duplicated += 1;
      else if (e.seq > seqs.last + 1) seqs.lost += e.seq - seqs.last - 1;
    }
    seqs.last = Math.max(seqs.last, e.seq);
    if (e.type === 'station:connected') connectedStations += 1;
    if (!current) return;
    const payload = e.payload as { pollId?: string; result?: string };
    if (e.type === 'poll:opened' && current.pollId === null) {
      current.pollId = payload.pollId!;
      pollOpenedSeq = e.seq;
      sizes.poll ??= JSON.stringify(e).length;
      sizes.answer ??= JSON.stringify({ countId, command: { type: 'poll:answer', pollId: payload.pollId, station: 'B001', answer: 'go' } }).length;
    } else if (e.type === 'poll:answered' && payload.pollId === current.pollId) {
      sizes.relay ??= JSON.stringify(e).length;
      current.answered += 1;
      if (current.answered === n) current.at = performance.now();
    } else if (e.type === 'poll:closed' && payload.pollId === current.pollId) {
      missingAnswers += n - current.answered;
      if (payload.result !== 'go') current.reject(new Error(`poll ${current.pollId} closed ${payload.result}: ${JSON.stringify(e.payload)}`));
      else current.resolve(current.at ?? performance.now());
      current = null;
    }
  }

  return {
    socket,
    seqs,
    sizes,
    connectedStations: () => connectedStations,
    missingAnswers: () => missingAnswers,
    /** The seq of the last poll:opened this client's poll() opened. */
    pollOpenedSeq: () => pollOpenedSeq,
    async join() {
      await new Promise<void>((resolve, reject) => {
        socket.once('connect', () => resolve());
        socket.once('connect_error', reject);
      });
      const joined = (await socket.timeout(10_000).emitWithAck('count:join', { countId, sinceSeq: 0 })) as Ack;
      if (joined.error) throw new Error(`conductor could not join: ${joined.error}`);
    },
    async command(command: object): Promise<CountEventDto[]> {
      const ack = (await socket.timeout(POLL_LIMIT_MS).emitWithAck('count:command', { countId, command })) as Ack;
      if (ack.error) throw new Error(`${JSON.stringify(command)} refused: ${ack.error}`);
      return ack.data!.events;
    },
    /** One poll to every station of the crew; ms from sending poll:open until the n-th poll:answered is in. */
    async poll(limitMs = POLL_LIMIT_MS): Promise<number> {
      const start = performance.now();
      const done = new Promise<number>((resolve, reject) => (current = { pollId: null, answered: 0, resolve, reject, at: null }));
      await this.command({ type: 'poll:open', question: 'Go for the next bench poll?', timeoutSeconds: 3600 });
      return (await withLimit(done, limitMs, 'holdfire poll')) - start;
    },
  };
}


// ---------------------------------------------------------------- statistics

export const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))]!;
export const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
};
export const f1 = (x: number) => x.toFixed(1);
export const f2 = (x: number) => x.toFixed(2);


// ---------------------------------------------------------------- the stack

export interface Stack {
  server: ChildProcess;
  stationProcs: ChildProcess[];
  url: string;
  wsUrl: string;
  /** The bare socket.io reference (bench/server.ts). */
  sioUrl: string;
  stations: BenchStation[];
  /** Session cookie per station code (its own operator, signed in). */
  cookies: Map<string, string>;
  conductor: Session;
  procedureId: number;
  revisionId: number;
  /** Stops the children and removes the data directory. */
  stop(): Promise<void>;
}

/**
 * The server process (the real server on a temporary SQLite file, with `stations` bench stations and operators made
 * by its set-up), the two station processes, the long-lead procedure, and a session for every operator.
 */
export async function startStack(stations: number): Promise<Stack> {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'holdfire-bench-'));
  const children: ChildProcess[] = [];
  let server: ChildProcess | undefined;
  const stop = async () => {
    if (server?.connected) {
      await askServer(server, { type: 'stop' }, 'stopped').catch((error) => console.error('server stop:', error));
    }
    for (const c of children) if (c.connected) c.disconnect();
    await Promise.all(children.map((c) => (c.exitCode !== null || c.signalCode !== null ? null : withLimit(new Promise((r) => c.once('exit', r)), 10_000, 'child exit').catch(() => c.kill()))));
    rmSync(dataDir, { recursive: true, force: true });
  };
  try {
    // BENCH_PROFILE=<dir>: write a V8 CPU profile of the server process there (open it in Chrome's DevTools).
    const profile = process.env.BENCH_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(process.env.BENCH_PROFILE)}`] : [];
    // --expose-gc: the memory readings collect garbage first, so they show what is held, not what is pending.
    server = fork(path.join(here, 'server.ts'), [], {
      env: { ...process.env, BENCH_DATA_DIR: dataDir },
      execArgv: [...process.execArgv, '--expose-gc', ...profile],
    });
    children.push(server);
    const { url, wsUrl, sioUrl } = await next<FromServer, 'listening'>(server, 'listening');
    const stationProcs = Array.from({ length: STATION_PROCESSES }, () => fork(path.join(here, 'stations.ts'), []));
    children.push(...stationProcs);

    const setup = await askServer(server, { type: 'setup', stations }, 'setup');
    const conductor = await signIn(url, 'conductor@ternvalley.test', DEMO_PASSWORD);
    const safety = await signIn(url, 'safety@ternvalley.test', DEMO_PASSWORD);
    const { procedureId, revisionId } = await longLeadProcedure(url, conductor, safety);
    const cookies = new Map<string, string>();
    // A few sign-ins at a time (each is three requests and a password check).
    for (let i = 0; i < setup.stations.length; i += 10) {
      const batch = setup.stations.slice(i, i + 10);
      const sessions = await Promise.all(batch.map((s) => signIn(url, s.email, setup.password)));
      batch.forEach((s, j) => cookies.set(s.code, sessions[j]!.cookie));
    }
    return { server, stationProcs, url, wsUrl, sioUrl, stations: setup.stations, cookies, conductor, procedureId, revisionId, stop };
  } catch (error) {
    await stop();
    throw error;
  }
}

/** Writes a crew plan of bench stations B(from+1)…B(from+n) and creates a count from it through the API. */
export async function benchCount(stack: Stack, n: number, from = 0, name = `Bench count, ${n} stations`): Promise<number> {
  await askServer(stack.server, { type: 'crew', procedureId: stack.procedureId, stations: n, from }, 'crew');
  const { json: count } = await call(stack.url, stack.conductor, 'POST', '/api/counts', { procedureId: stack.procedureId, revisionId: stack.revisionId, name });
  return count.id as number;
}

/** Waits until the conductor's client has seen `n` station:connected events. */
export async function allConnected(tc: { connectedStations: () => number }, n: number, limitMs = 60_000): Promise<void> {
  for (let waited = 0; tc.connectedStations() < n; waited += 20) {
    if (waited > limitMs) throw new Error(`only ${tc.connectedStations()} of ${n} stations show as connected`);
    await sleep(20);
  }
}
