import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { dueEvents, nextDueAt, replayIndex, stateAt, tAt, type CountEvent, type CountState } from '../../src/domain/count';
import { at, conductor, prop, range, Sim, START } from './count-fixture';

describe('dueEvents', () => {
  it('catches up over several steps, each at its own exact instant', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    // Nothing appended yet: the server slept through half an hour.
    expect(sim.events.map((e) => e.type)).toEqual(['count:created', 'count:started']);
    expect(nextDueAt(sim.state)).toBe(START);
    const due = dueEvents(sim.state, at(1830));
    // T-30:00 at START: s1 and the untimed s2 after it; T-20:00 600 s on; the built-in hold at T-15:00 900 s on,
    // 600 s long; T-10:00 300 s of clock after it ends, at START + 1800 s, opens the poll.
    expect(due.map((d) => [d.type, 'stepKey' in d.payload ? d.payload.stepKey : null, d.at])).toEqual([
      ['step:reached', 's1', at(0)],
      ['step:reached', 's2', at(0)],
      ['step:reached', 's3', at(600)],
      ['step:reached', 's4', at(900)],
      ['builtInHold:started', 's4', at(900)],
      ['builtInHold:ended', 's4', at(1500)],
      ['step:reached', 's5', at(1800)],
      ['poll:opened', 's5', at(1800)],
    ]);
    expect(due.every((d) => d.actor === null)).toBe(true);
    sim.advance(at(1830));
    // Next: the poll's timeout, 60 s after it opened.
    expect(nextDueAt(sim.state)).toBe(at(1860));
  });

  it('reaches T-0 after the steps at T-0 and before those after it', () => {
    const sim = new Sim().toAfterPoll();
    const due = sim.advance(at(2415));
    expect(due.map((e) => [e.type, e.at])).toEqual([
      ['step:reached', at(2100)],
      ['step:reached', at(2340)],
      ['step:reached', at(2400)],
      ['t0:reached', at(2400)],
      ['step:reached', at(2410)],
    ]);
    expect(nextDueAt(sim.state)).toBeNull();
  });

  it('makes nothing due while holding but the end of an open poll', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(range, { type: 'hold:call', category: 'range', reason: 'Gate open' }, at(10));
    expect(nextDueAt(sim.state)).toBeNull();
    expect(dueEvents(sim.state, at(5000))).toEqual([]);
  });
});

describe('stateAt', () => {
  it('equals the state folded live at each chosen instant', () => {
    const sim = new Sim();
    const snapshots: [number, CountState][] = [];
    const take = (now: number) => {
      sim.advance(now);
      snapshots.push([now, sim.state]);
    };
    sim.ok(conductor, { type: 'count:start' }, START);
    take(at(300));
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'LOX fill valve sticking' }, at(320));
    take(at(400));
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(500));
    sim.ok(conductor, { type: 'count:resume' }, at(510));
    take(at(1200));
    take(at(2000));
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'nogo', reason: 'vent valve slow' }, at(2005));
    take(at(2100));
    for (const [instant, live] of snapshots) {
      const past = stateAt(sim.events, instant);
      expect(past).toEqual(live);
      expect(tAt(past, instant)).toBe(tAt(live, instant));
    }
    // At START + 400 s the count stood on hold where it was called, 320 s after T-30:00: -1480 (T-24:40).
    expect(tAt(stateAt(sim.events, at(400)), at(400))).toBe(-1480);
  });
});

describe('replayIndex', () => {
  /** A count with holds, polls, a redline and a recycle: dozens of events at many instants, several at the same one. */
  function busyCount() {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'LOX fill valve sticking' }, at(320));
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(500));
    sim.ok(conductor, { type: 'count:resume' }, at(510));
    sim.advance(at(2000));
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'nogo', reason: 'vent valve slow' }, at(2005));
    // The poll times out with two stations silent and holds the count; the conductor clears it and recycles.
    sim.advance(at(2090));
    sim.ok(conductor, { type: 'hold:clear', holdId: 'h2' }, at(2095));
    sim.ok(conductor, { type: 'count:recycle', toSeconds: -1200, reason: 'vent valve swapped' }, at(2100));
    sim.ok(conductor, { type: 'count:resume' }, at(2200));
    // The poll step comes round again after the recycle; it times out unanswered and holds the count once more.
    sim.advance(at(5000));
    return sim.events;
  }

  it('gives the same state as stateAt at any instant, whatever the spacing of its kept states', () => {
    const events = busyCount();
    expect(events.length).toBeGreaterThan(25);
    const first = events[0]!.at;
    const last = events.at(-1)!.at;
    const instant = fc.oneof(
      fc.integer({ min: first - 5000, max: last + 5000 }),
      fc.constantFrom(...events.map((e) => e.at)),
      fc.constantFrom(...events.map((e) => e.at - 1)),
    );
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 40 }), fc.array(instant, { minLength: 1, maxLength: 12 }), (every, instants) => {
        const index = replayIndex(events, every);
        for (const t of instants) expect(index.stateAt(t)).toEqual(stateAt(events, t));
        expect(index.final).toEqual(stateAt(events, last));
      }),
      { numRuns: 150 },
    );
  });

  it('shows its caller each step of the one fold', () => {
    const events = busyCount();
    const steps: [number, number, number][] = [];
    replayIndex(events, 5, (e, before, after) => steps.push([e.seq, before.lastSeq, after.lastSeq]));
    expect(steps).toEqual(events.map((e, i) => [e.seq, i === 0 ? 0 : events[i - 1]!.seq, e.seq]));
  });

  it('answers a log whose instants go back as stateAt does', () => {
    const events = busyCount();
    // An imported log with one event dated before the one before it.
    const shuffled: CountEvent[] = events.map((e, i) => (i === 10 ? { ...e, at: events[3]!.at } : e));
    const index = replayIndex(shuffled, 4);
    for (const t of [events[3]!.at, events[9]!.at, events[12]!.at]) expect(index.stateAt(t)).toEqual(stateAt(shuffled, t));
  });
});
