/**
 * `npm run bench`: the live count's go/no-go poll round trip through the whole Holdfire stack, beside a raw
 * `ws` reference with the same number of clients and message sizes. See bench/README.md.
 *
 * Processes: this one (orchestrator and the test conductor's client), bench/server.ts (the real server and
 * the ws reference server) and two bench/stations.ts processes sharing the simulated stations. Everything
 * talks over 127.0.0.1 only; the temporary data directory is removed at the end.
 */
import { fork, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { io as connect } from 'socket.io-client';
import WebSocket from 'ws';
import type { CountEventDto } from '../src/contract/count';
import { benchReplay } from './replay';
import type { BenchStation, FromServer, FromStations, MessageSizes, ServerTimings, StationStats, ToServer, ToStations } from './protocol';

const FULL = [
  { n: 10, warmup: 20, measured: 100 },
  { n: 50, warmup: 20, measured: 100 },
  // A poll at 200 stations takes seconds here (see README): few polls, so the bench stays within minutes.
  { n: 200, warmup: 3, measured: 12 },
];
/** BENCH_QUICK=1: a short smoke run of the whole bench, for working on the bench itself. */
/** BENCH_SIZES=50 (or 10,50): only those N, for profiling one size. */
const SIZES = process.env.BENCH_SIZES ? process.env.BENCH_SIZES.split(',').map(Number) : null;
const RUNS = (process.env.BENCH_QUICK ? FULL.map((r) => ({ ...r, warmup: 2, measured: 3 })) : FULL).filter((r) => !SIZES || SIZES.includes(r.n));
const GAP_MS = 5;
const POLL_LIMIT_MS = 30_000;
const STATION_PROCESSES = 2;
const DEMO_PASSWORD = 'kestrel-demo';

const here = path.dirname(fileURLToPath(import.meta.url));
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function withLimit<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  let timer: NodeJS.Timeout;
  return Promise.race([p, new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error(`${what}: nothing after ${ms} ms`)), ms)))]).finally(() =>
    clearTimeout(timer),
  );
}

// ---------------------------------------------------------------- child processes

/** The next message of `type` from the child (an 'error' message rejects). */
function next<M extends { type: string }, T extends M['type']>(child: ChildProcess, type: T, ms = 120_000): Promise<Extract<M, { type: T }>> {
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
function askServer<T extends FromServer['type']>(server: ChildProcess, m: ToServer, type: T) {
  const answer = next<FromServer, T>(server, type);
  server.send(m);
  return answer;
}
function askStations<T extends FromStations['type']>(children: ChildProcess[], messages: ToStations[], type: T) {
  return Promise.all(
    children.map((c, i) => {
      const answer = next<FromStations, T>(c, type);
      c.send(messages[i] ?? messages[0]!);
      return answer;
    }),
  );
}

// ---------------------------------------------------------------- HTTP with a real session

interface Session {
  cookie: string;
  csrf: string;
}

function sidFrom(res: Response, fallback = ''): string {
  const line = res.headers.getSetCookie().find((c) => c.startsWith('holdfire.sid='));
  return line ? line.split(';')[0]! : fallback;
}

async function csrfFor(base: string, cookie: string): Promise<Session> {
  const res = await fetch(`${base}/api/auth/csrf`, { headers: cookie ? { cookie } : {} });
  if (!res.ok) throw new Error(`csrf: ${res.status}`);
  const body = (await res.json()) as { csrfToken: string };
  return { cookie: sidFrom(res, cookie), csrf: body.csrfToken };
}

async function call(base: string, s: Session, method: string, url: string, body: object = {}) {
  const res = await fetch(`${base}${url}`, {
    method,
    headers: { cookie: s.cookie, 'x-csrf-token': s.csrf, 'content-type': 'application/json' },
    body: JSON.stringify(body),
  });
  const json = (await res.json().catch(() => null)) as Record<string, unknown> | null;
  if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${JSON.stringify(json)}`);
  return { res, json: json! };
}

async function signIn(base: string, email: string, password: string): Promise<Session> {
  const anonymous = await csrfFor(base, '');
  const { res } = await call(base, anonymous, 'POST', '/api/auth/login', { email, password });
  return csrfFor(base, sidFrom(res, anonymous.cookie));
}

/** A released procedure whose only steps are T-10 h (reached at the start) and T-0: the clock never gets in the way. */
async function longLeadProcedure(base: string, conductor: Session, safety: Session) {
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

type Ack = { data?: { events: CountEventDto[] }; error?: string };

interface Seqs {
  last: number;
  lost: number;
  duplicated: number;
}

function conductorSocket(url: string, cookie: string, countId: number, n: number) {
  const socket = connect(url, { transports: ['websocket'], reconnection: false, forceNew: true, timeout: 10_000, extraHeaders: { cookie } });
  const seqs: Seqs = { last: -1, lost: 0, duplicated: 0 };
  let connectedStations = 0;
  let current: { pollId: string | null; answered: number; resolve: (at: number) => void; reject: (e: Error) => void; at: number | null } | null = null;
  const sizes: Partial<MessageSizes> = {};
  let missingAnswers = 0;

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
    async poll(): Promise<number> {
      const start = performance.now();
      const done = new Promise<number>((resolve, reject) => (current = { pollId: null, answered: 0, resolve, reject, at: null }));
      await this.command({ type: 'poll:open', question: 'Go for the next bench poll?', timeoutSeconds: 3600 });
      return (await withLimit(done, POLL_LIMIT_MS, 'holdfire poll')) - start;
    },
  };
}

function conductorWs(wsUrl: string, n: number) {
  const socket = new WebSocket(`${wsUrl}/?role=conductor`);
  let current: { id: number; seen: Set<number>; resolve: (at: number) => void } | null = null;
  let duplicated = 0;
  let lost = 0;
  let id = 0;
  socket.on('message', (data) => {
    const reply = JSON.parse(data.toString()) as { id: number; station: number };
    if (!current || reply.id !== current.id) return;
    if (current.seen.has(reply.station)) duplicated += 1;
    current.seen.add(reply.station);
    if (current.seen.size === n) {
      current.resolve(performance.now());
      current = null;
    }
  });
  return {
    socket,
    duplicated: () => duplicated,
    lost: () => lost,
    open: () =>
      new Promise<void>((resolve, reject) => {
        socket.once('open', () => resolve());
        socket.once('error', reject);
      }),
    async poll(sizes: MessageSizes): Promise<number> {
      id += 1;
      const head = JSON.stringify({ id, answerSize: sizes.answer, relaySize: sizes.relay, pad: '' });
      const message = JSON.stringify({ id, answerSize: sizes.answer, relaySize: sizes.relay, pad: 'x'.repeat(Math.max(0, sizes.poll - head.length)) });
      const seen = new Set<number>();
      const start = performance.now();
      const done = new Promise<number>((resolve) => (current = { id, seen, resolve }));
      socket.send(message);
      try {
        return (await withLimit(done, POLL_LIMIT_MS, 'ws poll')) - start;
      } catch (error) {
        lost += n - seen.size;
        throw error;
      }
    },
  };
}

// ---------------------------------------------------------------- statistics

const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))]!;
const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
};
const f1 = (x: number) => x.toFixed(1);
const f2 = (x: number) => x.toFixed(2);

function diff(a: ServerTimings, b: ServerTimings): ServerTimings {
  return Object.fromEntries(Object.keys(a).map((k) => [k, b[k as keyof ServerTimings] - a[k as keyof ServerTimings]])) as unknown as ServerTimings;
}
function add(into: ServerTimings | null, d: ServerTimings): ServerTimings {
  if (!into) return { ...d };
  for (const k of Object.keys(d) as (keyof ServerTimings)[]) into[k] += d[k];
  return into;
}

// ---------------------------------------------------------------- the run

async function main() {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'holdfire-bench-'));
  const children: ChildProcess[] = [];
  let server: ChildProcess | undefined;
  try {
    // BENCH_PROFILE=<dir>: write a V8 CPU profile of the server process there (open it in Chrome's DevTools).
    const profile = process.env.BENCH_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${path.resolve(process.env.BENCH_PROFILE)}`] : [];
    server = fork(path.join(here, 'server.ts'), [], { env: { ...process.env, BENCH_DATA_DIR: dataDir }, execArgv: [...process.execArgv, ...profile] });
    children.push(server);
    const { url, wsUrl } = await next<FromServer, 'listening'>(server, 'listening');
    const stationProcs = Array.from({ length: STATION_PROCESSES }, () => fork(path.join(here, 'stations.ts'), []));
    children.push(...stationProcs);

    const most = Math.max(...RUNS.map((r) => r.n));
    const setup = await askServer(server, { type: 'setup', stations: most }, 'setup');
    const conductor = await signIn(url, 'conductor@ternvalley.test', DEMO_PASSWORD);
    const safety = await signIn(url, 'safety@ternvalley.test', DEMO_PASSWORD);
    const { procedureId, revisionId } = await longLeadProcedure(url, conductor, safety);
    const cookies = new Map<string, string>();
    for (const s of setup.stations) cookies.set(s.code, (await signIn(url, s.email, setup.password)).cookie);
    console.log(`# ${new Date().toISOString()} node ${process.version}, ${STATION_PROCESSES} station processes, ${GAP_MS} ms between polls`);

    for (const run of RUNS) {
      const { n } = run;
      await askServer(server, { type: 'crew', procedureId, stations: n }, 'crew');
      const { json: count } = await call(url, conductor, 'POST', '/api/counts', { procedureId, revisionId, name: `Bench count, ${n} stations` });
      const countId = count.id as number;
      const tc = conductorSocket(url, conductor.cookie, countId, n);
      await tc.join();

      const before = (await askServer(server, { type: 'timings' }, 'timings')).timings;
      const mine: BenchStation[][] = stationProcs.map(() => []);
      setup.stations.slice(0, n).forEach((s, i) => mine[i % STATION_PROCESSES]!.push(s));
      await askStations(
        stationProcs,
        mine.map((list) => ({ type: 'holdfire', url, countId, stations: list.map((s) => ({ code: s.code, cookie: cookies.get(s.code)! })) })),
        'ready',
      );
      for (let waited = 0; tc.connectedStations() < n; waited += 20) {
        if (waited > 30_000) throw new Error(`only ${tc.connectedStations()} of ${n} stations show as connected`);
        await sleep(20);
      }
      if (n === most) {
        await sleep(500);
        const after = (await askServer(server, { type: 'timings' }, 'timings')).timings;
        const perStation = (after.rssBytes - before.rssBytes) / n / 1024;
        console.log(`server-rss N=${n} rss_mb=${f1(after.rssBytes / 2 ** 20)} before_stations_mb=${f1(before.rssBytes / 2 ** 20)} per_station_kib=${f1(perStation)}`);
      }
      await tc.command({ type: 'count:start' });

      const ref = conductorWs(wsUrl, n);
      await ref.open();
      const half = Math.ceil(n / STATION_PROCESSES);
      await askStations(
        stationProcs,
        stationProcs.map((_, i) => ({ type: 'ws', wsUrl, clients: Math.max(0, Math.min(half, n - i * half)), firstIndex: i * half })),
        'ready',
      );

      // Warm-up, then measure: Holdfire and ws alternate, so machine noise falls on both alike.
      const hf: number[] = [];
      const raw: number[] = [];
      let hfServer: ServerTimings | null = null;
      let wsServer: ServerTimings | null = null;
      for (let i = 0; i < run.warmup + run.measured; i++) {
        const measuring = i >= run.warmup;
        const t0 = measuring ? (await askServer(server, { type: 'timings' }, 'timings')).timings : null;
        const a = await tc.poll();
        await sleep(GAP_MS);
        const t1 = measuring ? (await askServer(server, { type: 'timings' }, 'timings')).timings : null;
        const b = await ref.poll(tc.sizes as MessageSizes);
        await sleep(GAP_MS);
        if (measuring) {
          const t2 = (await askServer(server, { type: 'timings' }, 'timings')).timings;
          hf.push(a);
          raw.push(b);
          hfServer = add(hfServer, diff(t0!, t1!));
          wsServer = add(wsServer, diff(t1!, t2));
        }
      }
      await sleep(200);
      const stats = (await askStations(stationProcs, [{ type: 'stats' }], 'stats')).map((m) => m.stats);
      const sum = (k: keyof StationStats) => stats.reduce((acc, s) => acc + s[k], 0);
      const polls = run.warmup + run.measured;
      const expectedWs = n * polls;
      const lost = sum('lost') + sum('refused') + (n * polls - sum('answered')) + tc.seqs.lost + tc.missingAnswers() + ref.lost() + (expectedWs - sum('wsReplies'));
      const duplicated = sum('duplicated') + tc.seqs.duplicated + ref.duplicated();
      const sorted = [...hf].sort((x, y) => x - y);
      const hm = median(hf);
      const wm = median(raw);
      console.log(
        `poll-rtt N=${n} holdfire_median_ms=${f1(hm)} holdfire_p99_ms=${f1(quantile(sorted, 0.99))} ws_median_ms=${f1(wm)} ratio=${f2(hm / wm)} lost=${lost} duplicated=${duplicated}`,
      );
      const m = run.measured;
      const h = hfServer!;
      const w = wsServer!;
      console.log(
        `server-per-poll N=${n} holdfire_cpu_ms=${f2(h.cpuMicros / 1000 / m)} ws_cpu_ms=${f2(w.cpuMicros / 1000 / m)}` +
          ` commands=${f1(h.commands / m)} command_ms_sum=${f2(h.commandMs / m)} append_wait_ms_sum=${f2(h.appendMs / m)}` +
          ` commits=${f1(h.commits / m)} broadcasts=${f1(h.broadcasts / m)} broadcast_ms_sum=${f2(h.broadcastMs / m)}` +
          ` status_updates=${f1(h.statusUpdates / m)} status_update_ms_sum=${f2(h.statusUpdateMs / m)}` +
          ` ws_p99_ms=${f1(quantile([...raw].sort((x, y) => x - y), 0.99))} sizes=${JSON.stringify(tc.sizes)}`,
      );

      await askStations(stationProcs, [{ type: 'close' }], 'closed');
      tc.socket.disconnect();
      ref.socket.close();
    }
  } finally {
    if (server?.connected) {
      await askServer(server, { type: 'stop' }, 'stopped').catch((error) => console.error('server stop:', error));
    }
    for (const c of children) if (c.connected) c.disconnect();
    await Promise.all(children.map((c) => (c.exitCode !== null || c.signalCode !== null ? null : withLimit(new Promise((r) => c.once('exit', r)), 10_000, 'child exit').catch(() => c.kill()))));
    rmSync(dataDir, { recursive: true, force: true });
  }
}

/** BENCH_PARTS=rtt,replay (default: all): which parts run. `replay` alone needs no server (bench/replay.ts). */
const PARTS = new Set((process.env.BENCH_PARTS ?? 'rtt,replay').split(',').map((p) => p.trim()));
if (PARTS.has('rtt')) await main();
if (PARTS.has('replay')) benchReplay();
