/**
 * Replay of a long count (part `replay` of `npm run bench`): a count of about 10,000 events, made with the domain's
 * own simulation (holds called and cleared, polls answered, resumes), then `stateAt` at 100 random instants and
 * the full timeline (the fold over every event, and the count report that walks it). No server, no disk.
 */
import { performance } from 'node:perf_hooks';
import { replay, replayIndex, stateAt } from '../src/domain/count/reduce';
import { countReport } from '../src/domain/count/report';
import { conductor, daq, kestrelPlan, prop, range, Sim, START } from '../tests/domain/count-fixture';

const TARGET = 10_000;

function longCount(): Sim {
  const sim = new Sim(kestrelPlan());
  let now = START;
  sim.ok(conductor, { type: 'count:start' }, now);
  let round = 0;
  while (sim.events.length < TARGET) {
    round += 1;
    now += 1000;
    // Holds stop the clock, so the count can go on for hours of wall time without reaching its built-in hold.
    const called = sim.ok(prop, { type: 'hold:call', category: 'hardware', reason: `Round ${round}: regulator creep` }, now);
    const holdId = (called.find((e) => e.type === 'hold:called')!.payload as { holdId: string }).holdId;
    now += 2000;
    const opened = sim.command(conductor, { type: 'poll:open', stations: ['PROP', 'RANGE', 'DAQ'], timeoutSeconds: 60 }, now);
    if (opened.ok) {
      const pollId = sim.state.poll!.pollId;
      for (const who of [prop, range, daq]) sim.ok(who, { type: 'poll:answer', pollId, station: who.mans[0]!, answer: 'go' }, (now += 500));
    }
    sim.ok(prop, { type: 'hold:clear', holdId }, (now += 1000));
    sim.ok(conductor, { type: 'count:resume' }, (now += 1000));
  }
  return sim;
}

function heapMb() {
  return process.memoryUsage().heapUsed / 2 ** 20;
}

export function benchReplay(): void {
  const built = performance.now();
  const sim = longCount();
  const events = sim.events;
  const buildMs = performance.now() - built;
  const first = events[0]!.at;
  const last = events.at(-1)!.at;
  // A fixed seed (mulberry32) so runs pick the same instants.
  let a = 20261202;
  const random = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const instants = Array.from({ length: 100 }, () => Math.floor(first + random() * (last - first)));
  global.gc?.();
  const heapBefore = heapMb();
  const rssBefore = process.memoryUsage().rss / 2 ** 20;
  const t0 = performance.now();
  let seqs = 0;
  for (const at of instants) seqs += stateAt(events, at).lastSeq;
  const stateAtMs = performance.now() - t0;
  // The replay page's way: fold once keeping states along the log, then ask for each instant.
  const ti = performance.now();
  const index = replayIndex(events);
  const indexBuildMs = performance.now() - ti;
  const tq = performance.now();
  let indexed = 0;
  for (const at of instants) indexed += index.stateAt(at).lastSeq;
  const indexMs = performance.now() - tq;
  if (indexed !== seqs) throw new Error('replay bench: the index does not answer as stateAt does');
  const t1 = performance.now();
  const full = replay(events);
  const replayMs = performance.now() - t1;
  const t2 = performance.now();
  const report = countReport(events);
  const reportMs = performance.now() - t2;
  const heapAfter = heapMb();
  const rssAfter = process.memoryUsage().rss / 2 ** 20;
  if (full.lastSeq !== events.length || seqs <= 0 || !report) throw new Error('replay bench: the replay does not match the events');
  console.log(
    `replay events=${events.length} state_at_100_ms=${stateAtMs.toFixed(1)} state_at_each_ms=${(stateAtMs / 100).toFixed(2)} full_replay_ms=${replayMs.toFixed(1)} report_ms=${reportMs.toFixed(1)} index_build_ms=${indexBuildMs.toFixed(1)} index_state_at_each_ms=${(indexMs / 100).toFixed(3)} heap_growth_mb=${(heapAfter - heapBefore).toFixed(1)} rss_mb=${rssAfter.toFixed(1)} rss_growth_mb=${(rssAfter - rssBefore).toFixed(1)} build_ms=${buildMs.toFixed(0)}`,
  );
}
