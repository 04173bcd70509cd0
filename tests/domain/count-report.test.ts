import { describe, expect, it } from 'vitest';
import { countReport } from '../../src/domain/count';
import { at, conductor, daq, prop, range, Sim, START } from './count-fixture';

// Every expected number below is arithmetic on the fixed instants of the scenario (START is T-30:00, one second
// of server time is one second of T while the clock runs); the comments show the sums.
function scenario() {
  const sim = new Sim();
  sim.ok(conductor, { type: 'count:start' }, START);
  // Two holds at once: PROP's from +100 s, RANGE's from +150 s; both cleared; the count resumes at +500 s.
  sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'LOX vent valve slow to close' }, at(100));
  sim.ok(range, { type: 'hold:call', category: 'range', reason: 'Walker on the footpath' }, at(150));
  sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(300));
  sim.ok(range, { type: 'hold:clear', holdId: 'h2' }, at(400));
  sim.ok(conductor, { type: 'count:resume' }, at(500));
  // 400 s lost: the reading at T-20:00 (600 s of clock from the start) comes at +1000 s; 15 bar is over its 14 bar max.
  sim.advance(at(1000));
  sim.ok(prop, { type: 'reading:record', stepKey: 's3', value: 15 }, at(1010));
  sim.ok(conductor, { type: 'hold:clear', holdId: 'h3' }, at(1030));
  sim.ok(conductor, { type: 'count:resume' }, at(1040));
  // T-19:50 at +1040 s; the built-in hold at T-15:00 comes 290 s later (+1330 s) and stands 600 s (to +1930 s);
  // the poll at T-10:00 opens 300 s after that, at +2230 s.
  sim.advance(at(2230));
  const pollId = sim.state.poll!.pollId;
  sim.ok(daq, { type: 'poll:answer', pollId, station: 'DAQ', answer: 'go' }, at(2231));
  sim.ok(prop, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' }, at(2232));
  sim.ok(range, { type: 'poll:answer', pollId, station: 'RANGE', answer: 'go' }, at(2235));
  // T-0 600 s of clock later: +2830 s.
  sim.advance(at(2900));
  return sim;
}

describe('the count report', () => {
  it('planned against actual T-0: planned is start + 1800 s of count + the 600 s built-in hold; the slip is the 430 s on holds', () => {
    const report = countReport(scenario().events);
    expect(report.startedAt).toBe(START);
    expect(report.startedAtT).toBe(-1800);
    expect(report.plannedT0At).toBe(at(1800 + 600));
    expect(report.actualT0At).toBe(at(2830));
    expect(report.slipSeconds).toBe(430);
  });

  it('holds: count, total with overlapping holds counted once, seconds by category each counted in full', () => {
    const sim = scenario();
    const report = countReport(sim.events);
    const redlineCategory = sim.state.holds[2]!.category;
    expect(report.holds.count).toBe(3);
    // 100..500 (the two overlapping holds) + 1010..1040.
    expect(report.holds.totalSeconds).toBe(400 + 30);
    expect(report.holds.byCategory.propellant).toBe(400);
    expect(report.holds.byCategory.range).toBe(350);
    expect(report.holds.byCategory[redlineCategory]).toBe(30 + (redlineCategory === 'propellant' ? 400 : redlineCategory === 'range' ? 350 : 0));
    expect(report.holds.list.map((h) => [h.holdId, h.calledByStation, h.calledAtT, h.seconds])).toEqual([
      ['h1', 'PROP', -1700, 400],
      ['h2', 'RANGE', -1700, 350],
      ['h3', 'PROP', -1190, 30],
    ]);
    expect(report.builtInHolds).toEqual({ count: 1, totalSeconds: 600 });
  });

  it('poll response times per station and the redline with its value, limit message and T', () => {
    const report = countReport(scenario().events);
    expect(report.polls).toMatchObject({ count: 1, passed: 1, failed: 0, cancelled: 0 });
    expect(report.polls.stations.map((s) => [s.station, s.asked, s.answered, s.missed, s.medianResponseMs])).toEqual([
      ['DAQ', 1, 1, 0, 1000],
      ['PROP', 1, 1, 0, 2000],
      ['RANGE', 1, 1, 0, 5000],
    ]);
    expect(report.redlines).toHaveLength(1);
    expect(report.redlines[0]).toMatchObject({ stepKey: 's3', station: 'PROP', value: 15, unit: 'bar', at: at(1010), t: -1190 });
    expect(report.redlines[0]!.message).toMatch(/15 bar above 14/);
  });

  it('a count picked up at T-5:00 plans T-0 300 s after its start and counts no skipped built-in hold', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start', fromSeconds: -300 }, START);
    sim.advance(at(400));
    const report = countReport(sim.events);
    expect(report.plannedT0At).toBe(at(300));
    expect(report.actualT0At).toBe(at(300));
    expect(report.slipSeconds).toBe(0);
    expect(report.builtInHolds.count).toBe(0);
  });
});
