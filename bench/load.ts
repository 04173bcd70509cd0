/**
 * `BENCH_PARTS=load`: the server under load, through the same stack as the poll round trip (bench/harness.ts: the
 * real server, real sessions, the stations in the two station processes). Three parts, one line each:
 *
 * - idle-500: 500 stations connected and idle, spread over three counts of 200, 200 and 100 (a crew plan lists at
 *   most 200 assignments); the server's RSS before and after, after garbage collection.
 * - polls-200x200: 200 stations answer 200 polls in a row; round trip and lost/duplicated as poll-rtt counts them.
 * - reconnect-storm: the 200 stations of that running count drop their sockets at once and reconnect at once,
 *   each rejoining from its last seq, while the conductor calls a hold and opens a poll; until every station has
 *   every event.
 */
import { performance } from 'node:perf_hooks';
import type { BenchStation, FromStations, StationStats, StormReport } from './protocol';
import {
  allConnected,
  askServer,
  askStations,
  benchCount,
  conductorSocket,
  f1,
  median,
  next,
  quantile,
  sleep,
  startStack,
  STATION_PROCESSES,
  withLimit,
  type Stack,
} from './harness';

const QUICK = Boolean(process.env.BENCH_QUICK);
const IDLE = 500;
/** At most this many assignments in one crew plan (src/contract/procedures.ts, crewPlanInputSchema). */
const CREW_PLAN_LIMIT = 200;
const POLL_N = 200;
const POLLS = QUICK ? 5 : 200;
const GAP_MS = 5;

/** Deals stations out to the station processes, every other one to each. */
function deal<T>(list: T[]): T[][] {
  const out: T[][] = Array.from({ length: STATION_PROCESSES }, () => []);
  list.forEach((s, i) => out[i % STATION_PROCESSES]!.push(s));
  return out;
}

async function connectStations(stack: Stack, list: { station: BenchStation; countId: number }[]) {
  await askStations(
    stack.stationProcs,
    deal(list).map((mine) => ({
      type: 'holdfire' as const,
      url: stack.url,
      countId: mine[0]?.countId ?? 0,
      stations: mine.map(({ station, countId }) => ({ code: station.code, cookie: stack.cookies.get(station.code)!, countId })),
    })),
    'ready',
  );
}

async function stationStats(stack: Stack): Promise<StationStats> {
  const all = (await askStations(stack.stationProcs, [{ type: 'stats' }], 'stats')).map((m) => m.stats);
  const sum: StationStats = { duplicated: 0, lost: 0, refused: 0, answered: 0, wsReplies: 0, sioReplies: 0, sioAcks: 0 };
  for (const s of all) for (const k of Object.keys(sum) as (keyof StationStats)[]) sum[k] += s[k];
  return sum;
}
const minus = (a: StationStats, b: StationStats): StationStats =>
  Object.fromEntries(Object.keys(a).map((k) => [k, a[k as keyof StationStats] - b[k as keyof StationStats]])) as unknown as StationStats;

const countBy = (xs: number[]) => xs.reduce<Record<number, number>>((acc, x) => ((acc[x] = (acc[x] ?? 0) + 1), acc), {});
const mb = (bytes: number) => f1(bytes / 2 ** 20);

// ---------------------------------------------------------------- idle-500

async function idle(stack: Stack) {
  const groups: { countId: number; stations: BenchStation[] }[] = [];
  for (let from = 0; from < IDLE; from += CREW_PLAN_LIMIT) {
    const n = Math.min(CREW_PLAN_LIMIT, IDLE - from);
    groups.push({ countId: await benchCount(stack, n, from, `Idle bench count, stations ${from + 1}-${from + n}`), stations: stack.stations.slice(from, from + n) });
  }
  const conductors = [];
  for (const g of groups) {
    const tc = conductorSocket(stack.url, stack.conductor.cookie, g.countId, g.stations.length);
    await tc.join();
    await tc.command({ type: 'count:start' });
    conductors.push(tc);
  }
  await sleep(500);
  const before = (await askServer(stack.server, { type: 'memory' }, 'memory')).memory;
  const started = performance.now();
  await connectStations(
    stack,
    groups.flatMap((g) => g.stations.map((station) => ({ station, countId: g.countId }))),
  );
  await Promise.all(conductors.map((tc, i) => allConnected(tc, groups[i]!.stations.length)));
  const connectMs = performance.now() - started;
  await sleep(2000); // idle: nothing is sent but the engine's heartbeats
  const after = (await askServer(stack.server, { type: 'memory' }, 'memory')).memory;
  const s = await stationStats(stack);
  const lost = s.lost + s.refused + conductors.reduce((a, tc) => a + tc.seqs.lost, 0);
  const duplicated = s.duplicated + conductors.reduce((a, tc) => a + tc.seqs.duplicated, 0);
  console.log(
    `load-idle N=${IDLE} rss_mb=${mb(after.rssBytes)} before_mb=${mb(before.rssBytes)} per_station_kib=${f1((after.rssBytes - before.rssBytes) / IDLE / 1024)}` +
      ` heap_mb=${mb(after.heapUsedBytes)} heap_before_mb=${mb(before.heapUsedBytes)} heap_per_station_kib=${f1((after.heapUsedBytes - before.heapUsedBytes) / IDLE / 1024)}` +
      ` counts=${groups.map((g) => g.stations.length).join('+')} connect_ms=${connectMs.toFixed(0)} gc=${after.collected ? 'yes' : 'no'} lost=${lost} duplicated=${duplicated}`,
  );
  await askStations(stack.stationProcs, [{ type: 'close' }], 'closed');
  for (const tc of conductors) tc.socket.disconnect();
}

// ---------------------------------------------------------------- polls-200x200 and reconnect-storm

async function pollsAndStorm(stack: Stack) {
  const n = POLL_N;
  const countId = await benchCount(stack, n, 0, `Load bench count, ${n} stations`);
  const tc = conductorSocket(stack.url, stack.conductor.cookie, countId, n);
  await tc.join();
  await connectStations(
    stack,
    stack.stations.slice(0, n).map((station) => ({ station, countId })),
  );
  await allConnected(tc, n);
  await tc.command({ type: 'count:start' });

  // ------------------------------------------------ 200 polls in a row
  const rtt: number[] = [];
  for (let i = 0; i < POLLS; i++) {
    rtt.push(await tc.poll());
    await sleep(GAP_MS);
  }
  await sleep(200);
  const s = await stationStats(stack);
  // As poll-rtt counts them: seq gaps on any socket, refused and missing answers; seqs doubled or going back.
  const lost = s.lost + s.refused + (n * POLLS - s.answered) + tc.seqs.lost + tc.missingAnswers();
  const duplicated = s.duplicated + tc.seqs.duplicated;
  const sorted = [...rtt].sort((a, b) => a - b);
  console.log(
    `load-polls N=${n} polls=${POLLS} median_ms=${f1(median(rtt))} p99_ms=${f1(quantile(sorted, 0.99))} lost=${lost} duplicated=${duplicated}` +
      ` max_ms=${f1(sorted[sorted.length - 1]!)} first_ms=${f1(rtt[0]!)}`,
  );

  // ------------------------------------------------ reconnect storm
  const statsBefore = await stationStats(stack);
  const seqBefore = tc.seqs.last;
  const conductorBefore = { lost: tc.seqs.lost, duplicated: tc.seqs.duplicated, missing: tc.missingAnswers() };
  const dropped = stack.stationProcs.map((c) => next<FromStations, 'dropped'>(c, 'dropped'));
  const rejoined = stack.stationProcs.map((c) => next<FromStations, 'rejoined'>(c, 'rejoined', 180_000));
  rejoined.forEach((p) => p.catch(() => {})); // awaited below; an early failure must not go unhandled meanwhile
  for (const c of stack.stationProcs) c.send({ type: 'storm' });
  const dropAt = Math.min(...(await Promise.all(dropped)).map((m) => m.at));
  // Meanwhile the conductor calls a hold and opens a poll: the stations learn of both from their catch-up or
  // live, and each answers the poll once it has it. Then the hold is cleared and the count resumes.
  const held = await tc.command({ type: 'hold:call', category: 'range', reason: 'Bench: range check while the stations reconnect' });
  const holdId = (held.find((e) => e.type === 'hold:called')?.payload as { holdId?: string } | undefined)?.holdId;
  if (!holdId) throw new Error(`hold:call gave no hold: ${JSON.stringify(held.map((e) => e.type))}`);
  const reports = async (targetSeq: number) =>
    (
      await Promise.all(
        stack.stationProcs.map((c) => {
          const answer = next<FromStations, 'storm-report'>(c, 'storm-report');
          c.send({ type: 'storm-report', targetSeq });
          return answer;
        }),
      )
    ).map((m) => m.report);
  let pollRtt: number;
  let failed: string[];
  try {
    pollRtt = await tc.poll(120_000);
    failed = (await withLimit(Promise.all(rejoined), 180_000, 'stations rejoining')).flatMap((m) => m.failed);
  } catch (error) {
    // Say where the stations are before giving up.
    const r = await reports(tc.pollOpenedSeq());
    const s2 = minus(await stationStats(stack), statsBefore);
    console.error(
      `load-reconnect failed: ${(error as Error).message}; poll:opened seq ${tc.pollOpenedSeq()}, conductor at seq ${tc.seqs.last};` +
        ` rejoined ${r.flatMap((x) => x.rejoinMs).filter((t) => !Number.isNaN(t)).length} of ${n}; with the poll ${r.flatMap((x) => x.caughtUpMs).filter((t) => t !== null).length};` +
        ` answered ${s2.answered}, refused ${s2.refused}, lost ${s2.lost}, duplicated ${s2.duplicated}; station seqs ${JSON.stringify(countBy(r.flatMap((x) => x.lastSeqs)))}`,
    );
    throw error;
  }
  const targetSeq = tc.pollOpenedSeq();
  await tc.command({ type: 'hold:clear', holdId });
  await tc.command({ type: 'count:resume' });
  // Every station must end with every event of the log; wait until they are all at the conductor's last seq.
  let report: StormReport[] = await reports(targetSeq);
  for (let waited = 0; waited < 30_000 && report.some((r) => r.lastSeqs.some((q) => q !== tc.seqs.last)); waited += 200) {
    await sleep(200);
    report = await reports(targetSeq);
  }
  const caught = report.flatMap((r) => r.caughtUpMs);
  const times = caught.filter((t): t is number => t !== null).sort((a, b) => a - b);
  const rejoin = report.flatMap((r) => r.rejoinMs).sort((a, b) => a - b);
  const catchUp = report.flatMap((r) => r.catchUpEvents);
  const behind = report.flatMap((r) => r.lastSeqs).reduce((a, q) => a + Math.max(0, tc.seqs.last - q), 0);
  const st = minus(await stationStats(stack), statsBefore);
  // Each poll:answer without a GO acknowledgement counts once (refused or unacknowledged are both in n - answered).
  const stormLost = failed.length + st.lost + (n - st.answered) + (caught.length - times.length) + behind + (tc.seqs.lost - conductorBefore.lost) + (tc.missingAnswers() - conductorBefore.missing);
  const conductorDuplicated = tc.seqs.duplicated - conductorBefore.duplicated;
  const stormDuplicated = st.duplicated + conductorDuplicated;
  const allMs = times.length ? times[times.length - 1]! : NaN;
  // The drop times of the two processes differ by the IPC; each station's times count from its own process's drop.
  console.log(
    `load-reconnect N=${n} all_caught_up_ms=${f1(allMs)} station_median_ms=${f1(median(times))} station_p99_ms=${f1(quantile(times, 0.99))}` +
      ` station_max_ms=${f1(allMs)} lost=${stormLost} duplicated=${stormDuplicated}` +
      ` rejoin_median_ms=${f1(median(rejoin))} rejoin_max_ms=${f1(rejoin[rejoin.length - 1]!)} catch_up_events_median=${median(catchUp)}` +
      ` join_answer_kib_median=${f1(median(report.flatMap((r) => r.replyBytes)) / 1024)} duplicated_conductor=${conductorDuplicated}` +
      ` lost_parts=seq:${st.lost},unanswered:${n - st.answered}(refused_or_no_ack:${st.refused}),failed:${failed.length},never:${caught.length - times.length},behind:${behind}` +
      ` overlap_dropped=${report.reduce((a, r) => a + r.overlap, 0)} chain_breaks=${report.reduce((a, r) => a + r.chainBreaks, 0)}` +
      ` events=${tc.seqs.last - seqBefore} poll_during_storm_ms=${f1(pollRtt)} since_drop_ms=${f1(performance.timeOrigin + performance.now() - dropAt)}`,
  );
  await askStations(stack.stationProcs, [{ type: 'close' }], 'closed');
  tc.socket.disconnect();
}

export async function benchLoad(): Promise<void> {
  const stack = await startStack(IDLE);
  try {
    console.log(`# load: ${new Date().toISOString()} node ${process.version}, ${STATION_PROCESSES} station processes`);
    await idle(stack);
    await pollsAndStorm(stack);
  } finally {
    await stack.stop();
  }
}
