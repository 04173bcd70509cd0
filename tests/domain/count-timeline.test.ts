/** Every instant is worked by hand from the fixture's plan (T-30:00 start, built-in hold T-15:00 for 600 s). */
import { describe, expect, it } from 'vitest';
import { instantsAtT } from '../../src/domain/count';
import { at, conductor, prop, Sim, START } from './count-fixture';

describe('instantsAtT', () => {
  it('finds the one instant a clock that ran straight through read T', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.advance(at(700));
    // T-20:00 is 600 s after the start at T-30:00.
    expect(instantsAtT(sim.events, -1200)).toEqual([at(600)]);
    // Not yet reached by the end of the log (T-18:20 at +700 s): no instant.
    expect(instantsAtT(sim.events, -60)).toEqual([]);
    // Before the start: never.
    expect(instantsAtT(sim.events, -2000)).toEqual([]);
  });

  it('after a built-in hold, T comes later on the wall by the hold’s length', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    // The log runs to the poll at T-10:00, 1800 s on: instants after its last event are not known.
    sim.advance(at(1850));
    // T-12:00 is 1080 s of clock from the start, plus the 600 s built-in hold at T-15:00.
    expect(instantsAtT(sim.events, -720)).toEqual([at(1680)]);
    // The hold's own T, T-15:00: reached at +900 s, where the clock stood until +1500 s: the first instant only.
    expect(instantsAtT(sim.events, -900)).toEqual([at(900)]);
  });

  it('a recycle makes the clock read the same T twice', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'LOX vent slow', station: 'PROP' }, at(300));
    sim.ok(conductor, { type: 'count:recycle', toSeconds: -1700, reason: 'Re-chill the line' }, at(400));
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(410));
    sim.ok(conductor, { type: 'count:resume' }, at(420));
    // The log runs on to T-20:00 (s3), 500 s of clock after the resume: at +920 s.
    sim.advance(at(1000));
    // T-28:00 (-1680): 120 s after the start, and again 20 s of clock after resuming at T-28:20 (-1700) at +420 s.
    expect(instantsAtT(sim.events, -1680)).toEqual([at(120), at(440)]);
    // T-25:00 (-1500): the clock stood there from the hold at +300 s until the recycle at +400 s, then ran through it
    // again 200 s of clock after +420 s.
    expect(instantsAtT(sim.events, -1500)).toEqual([at(300), at(620)]);
  });
});
