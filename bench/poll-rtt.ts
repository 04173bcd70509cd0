/**
 * `npm run bench`: the live count's go/no-go poll round trip through the whole Holdfire stack, beside a raw
 * `ws` reference with the same number of clients and message sizes. See bench/README.md.
 *
 * Processes: this one (orchestrator and the test conductor's client), bench/server.ts (the real server and
 * the ws reference server) and two bench/stations.ts processes sharing the simulated stations. Everything
 * talks over 127.0.0.1 only; the temporary data directory is removed at the end.
 */
import { io as connectSio } from 'socket.io-client';
import WebSocket from 'ws';
import { allConnected, askServer, askStations, benchCount, conductorSocket, f1, f2, median, POLL_LIMIT_MS, quantile, sleep, startStack, STATION_PROCESSES, withLimit } from './harness';
import { benchLoad } from './load';
import { benchReplay } from './replay';
import type { BenchStation, MessageSizes, ServerTimings, StationStats } from './protocol';

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


// ---------------------------------------------------------------- the references' conductors

/**
 * A reference's conductor side: sends a poll (the message padded to Holdfire's poll:opened) and times it until the
 * n-th station's reply has come back, counting replies doubled and missing.
 */
function referencePolls(n: number, what: string, send: (message: { id: number; answerSize: number; ackSize: number; relaySize: number; pad: string }) => void) {
  let current: { id: number; seen: Set<number>; resolve: (at: number) => void } | null = null;
  let duplicated = 0;
  let lost = 0;
  let id = 0;
  return {
    duplicated: () => duplicated,
    lost: () => lost,
    reply(reply: { id: number; station: number }) {
      if (!current || reply.id !== current.id) return;
      if (current.seen.has(reply.station)) duplicated += 1;
      current.seen.add(reply.station);
      if (current.seen.size === n) {
        current.resolve(performance.now());
        current = null;
      }
    },
    async poll(sizes: MessageSizes): Promise<number> {
      id += 1;
      // An acknowledgement (socket.io only) is about the size of the poll:answered event Holdfire's carries.
      const head = { id, answerSize: sizes.answer, ackSize: sizes.relay, relaySize: sizes.relay };
      const message = { ...head, pad: 'x'.repeat(Math.max(0, sizes.poll - JSON.stringify({ ...head, pad: '' }).length)) };
      const seen = new Set<number>();
      const start = performance.now();
      const done = new Promise<number>((resolve) => (current = { id, seen, resolve }));
      send(message);
      try {
        return (await withLimit(done, POLL_LIMIT_MS, `${what} poll`)) - start;
      } catch (error) {
        lost += n - seen.size;
        throw error;
      }
    },
  };
}

function conductorWs(wsUrl: string, n: number) {
  const socket = new WebSocket(`${wsUrl}/?role=conductor`);
  const polls = referencePolls(n, 'ws', (message) => socket.send(JSON.stringify(message)));
  socket.on('message', (data) => polls.reply(JSON.parse(data.toString()) as { id: number; station: number }));
  return {
    ...polls,
    socket,
    open: () =>
      new Promise<void>((resolve, reject) => {
        socket.once('open', () => resolve());
        socket.once('error', reject);
      }),
  };
}

/** The bare socket.io reference's conductor (bench/server.ts). */
function conductorSio(sioUrl: string, n: number) {
  const socket = connectSio(sioUrl, { transports: ['websocket'], reconnection: false, forceNew: true, query: { role: 'conductor' } });
  const polls = referencePolls(n, 'socket.io', (message) => socket.emit('open', message));
  socket.on('answered', (reply: { id: number; station: number }) => polls.reply(reply));
  return {
    ...polls,
    socket,
    open: () =>
      new Promise<void>((resolve, reject) => {
        socket.once('connect', () => resolve());
        socket.once('connect_error', reject);
      }),
  };
}

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
  const most = Math.max(...RUNS.map((r) => r.n));
  const stack = await startStack(most);
  const { server, stationProcs, url, wsUrl, sioUrl, conductor } = stack;
  const cookies = stack.cookies;
  try {
    console.log(`# ${new Date().toISOString()} node ${process.version}, ${STATION_PROCESSES} station processes, ${GAP_MS} ms between polls`);

    for (const run of RUNS) {
      const { n } = run;
      const countId = await benchCount(stack, n);
      const tc = conductorSocket(url, conductor.cookie, countId, n);
      await tc.join();

      const before = (await askServer(server, { type: 'timings' }, 'timings')).timings;
      const mine: BenchStation[][] = stationProcs.map(() => []);
      stack.stations.slice(0, n).forEach((s, i) => mine[i % STATION_PROCESSES]!.push(s));
      await askStations(
        stationProcs,
        mine.map((list) => ({ type: 'holdfire', url, countId, stations: list.map((s) => ({ code: s.code, cookie: cookies.get(s.code)! })) })),
        'ready',
      );
      await allConnected(tc, n, 30_000);
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
      const bare = conductorSio(sioUrl, n);
      await bare.open();
      await askStations(
        stationProcs,
        stationProcs.map((_, i) => ({ type: 'sio', sioUrl, clients: Math.max(0, Math.min(half, n - i * half)), firstIndex: i * half })),
        'ready',
      );

      // Warm-up, then measure: Holdfire, ws and bare socket.io take turns, so machine noise falls on all alike.
      const hf: number[] = [];
      const raw: number[] = [];
      const sioTimes: number[] = [];
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
        const t2 = measuring ? (await askServer(server, { type: 'timings' }, 'timings')).timings : null;
        const c = await bare.poll(tc.sizes as MessageSizes);
        await sleep(GAP_MS);
        if (measuring) {
          hf.push(a);
          raw.push(b);
          sioTimes.push(c);
          hfServer = add(hfServer, diff(t0!, t1!));
          wsServer = add(wsServer, diff(t1!, t2!));
        }
      }
      await sleep(200);
      const stats = (await askStations(stationProcs, [{ type: 'stats' }], 'stats')).map((m) => m.stats);
      const sum = (k: keyof StationStats) => stats.reduce((acc, s) => acc + s[k], 0);
      const polls = run.warmup + run.measured;
      const expectedWs = n * polls;
      const lost = sum('lost') + sum('refused') + (n * polls - sum('answered')) + tc.seqs.lost + tc.missingAnswers() + ref.lost() + (expectedWs - sum('wsReplies'));
      const duplicated = sum('duplicated') + tc.seqs.duplicated + ref.duplicated();
      const sioLost = bare.lost() + (n * polls - sum('sioReplies')) + (n * polls - sum('sioAcks'));
      const sorted = [...hf].sort((x, y) => x - y);
      const hm = median(hf);
      const wm = median(raw);
      console.log(
        `poll-rtt N=${n} holdfire_median_ms=${f1(hm)} holdfire_p99_ms=${f1(quantile(sorted, 0.99))} ws_median_ms=${f1(wm)} ratio=${f2(hm / wm)} lost=${lost} duplicated=${duplicated}`,
      );
      const sm = median(sioTimes);
      console.log(
        `poll-rtt-socketio N=${n} socketio_median_ms=${f1(sm)} socketio_p99_ms=${f1(quantile([...sioTimes].sort((x, y) => x - y), 0.99))} ws_median_ms=${f1(wm)} socketio_to_ws=${f2(sm / wm)} holdfire_to_socketio=${f2(hm / sm)} lost=${sioLost} duplicated=${bare.duplicated()}`,
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
      bare.socket.disconnect();
    }
  } finally {
    await stack.stop();
  }
}

/**
 * BENCH_PARTS=rtt,replay,load (default: all): which parts run. `replay` alone needs no server (bench/replay.ts);
 * `load` starts its own server with 500 stations (bench/load.ts).
 */
const PARTS = new Set((process.env.BENCH_PARTS ?? 'rtt,replay,load').split(',').map((p) => p.trim()));
if (PARTS.has('rtt')) await main();
if (PARTS.has('replay')) benchReplay();
if (PARTS.has('load')) await benchLoad();
