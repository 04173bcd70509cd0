import { describe, expect, it } from 'vitest';
import { holdTimeByCategory, projectedT0, tAt, windowWarning } from '../../src/domain/count';
import { at, conductor, daq, kestrelPlan, prop, range, safety, Sim, START } from './count-fixture';

// All times are plain arithmetic on fixed epoch instants: T runs one second per second of server time while the
// clock runs; START is T-30:00 (-1800 s), so START + 100 s is T-28:20 (-1700 s).
describe('the count clock', () => {
  it('stands at the start time until the count starts, then runs', () => {
    const sim = new Sim();
    expect(sim.state.status).toBe('ready');
    expect(tAt(sim.state, at(-30))).toBe(-1800);
    sim.ok(conductor, { type: 'count:start' }, START);
    expect(sim.state.status).toBe('counting');
    expect(tAt(sim.state, at(100))).toBe(-1700);
    expect(tAt(sim.state, at(100.5))).toBe(-1699.5);
  });

  it('stops for everyone while a hold is open and runs again from the same T when resumed', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'LOX fill line frosting at a flange' }, at(100));
    expect(sim.state.status).toBe('holding');
    expect(sim.state.clock.running).toBe(false);
    expect(sim.state.hold).toMatchObject({ holdId: 'h1', calledByStation: 'PROP', calledAtT: -1700, cleared: false });
    expect(tAt(sim.state, at(400))).toBe(-1700);
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(450));
    expect(sim.state.hold).toMatchObject({ holdId: 'h1', cleared: true });
    expect(tAt(sim.state, at(480))).toBe(-1700);
    sim.ok(conductor, { type: 'count:resume' }, at(500));
    expect(sim.state.hold).toBeNull();
    // 30 s after the resume: -1700 + 30.
    expect(tAt(sim.state, at(530))).toBe(-1670);
  });

  it('reaches no step while holding: the step at T-20:00 comes 600 s of running clock after the start', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(prop, { type: 'hold:call', category: 'hardware', reason: 'Igniter continuity out of range' }, at(100));
    sim.advance(at(1000));
    expect(sim.state.steps.s3.status).toBe('pending');
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(1000));
    sim.ok(conductor, { type: 'count:resume' }, at(1000));
    // 500 s of clock were left to run to -1200: 1000 + 500.
    sim.advance(at(1499));
    expect(sim.state.steps.s3.status).toBe('pending');
    const reached = sim.advance(at(1500));
    expect(reached.map((e) => [e.type, e.at])).toEqual([['step:reached', at(1500)]]);
  });
});

describe('picking the count up later (a rehearsal of its last minutes)', () => {
  it('starts the clock at the chosen T; the steps before it are skipped, the built-in hold among them', () => {
    const sim = new Sim();
    const started = sim.ok(conductor, { type: 'count:start', fromSeconds: -700 }, START);
    expect(started.map((e) => [e.type, e.payload])).toEqual([['count:started', { fromSeconds: -700 }]]);
    expect(tAt(sim.state, at(40))).toBe(-660);
    // s1 to s4 (T-30:00 to T-15:00, the untimed s2 after s1) are skipped: done, with nobody's name on them.
    for (const key of ['s1', 's2', 's3', 's4']) expect(sim.state.steps[key]).toMatchObject({ status: 'done', skipped: true, completedBy: null });
    expect(sim.state.steps.s5).toMatchObject({ status: 'pending' });
    expect(sim.state.builtInHold).toBeNull();
    // Projected T-0 counts no built-in hold: the only one was skipped. 700 s from START.
    expect(projectedT0(sim.state, START)).toBe(at(700));
    // The poll at T-10:00 opens 100 s in.
    const due = sim.advance(at(100));
    expect(due.map((e) => [e.type, e.at])).toEqual([
      ['step:reached', at(100)],
      ['poll:opened', at(100)],
    ]);
  });

  it('is refused before the plan starts or at T-0 and later, and once the count runs', () => {
    const sim = new Sim();
    for (const fromSeconds of [-1801, 0, 5]) {
      const d = sim.command(conductor, { type: 'count:start', fromSeconds }, START);
      expect(d).toMatchObject({ ok: false, status: 400 });
      if (!d.ok) expect(d.error).toContain('between T-30:00 and T-0:01');
    }
    // The plan's own start is an ordinary start.
    expect(sim.ok(conductor, { type: 'count:start', fromSeconds: -1800 }, START)[0]!.payload).toEqual({});
    expect(sim.command(conductor, { type: 'count:start', fromSeconds: -60 }, at(1))).toMatchObject({ ok: false, status: 409 });
  });
});

describe('built-in holds', () => {
  it('stop the clock exactly at their time for their length and resume by themselves', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    const events = sim.advance(at(1000));
    const started = events.find((e) => e.type === 'builtInHold:started')!;
    // T-15:00 is 900 s after T-30:00.
    expect(started.at).toBe(at(900));
    expect(sim.state.builtInHold).toEqual({ stepKey: 's4', startedAt: at(900), durationSeconds: 600 });
    expect(tAt(sim.state, at(1200))).toBe(-900);
    expect(sim.state.status).toBe('counting');
    const ended = sim.advance(at(1600));
    expect(ended[0]).toMatchObject({ type: 'builtInHold:ended', at: at(1500), payload: { stepKey: 's4', early: false } });
    expect(sim.state.steps.s4.status).toBe('done');
    // Running again from -900 at START + 1500 s: at START + 1560 s it reads -840.
    expect(tAt(sim.state, at(1560))).toBe(-840);
  });

  it('can be released early by the conductor, and only by the conductor', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.advance(at(1000));
    const refused = sim.command(prop, { type: 'builtInHold:release' }, at(1000));
    expect(refused).toMatchObject({ ok: false, status: 403 });
    sim.ok(conductor, { type: 'builtInHold:release' }, at(1000));
    expect(sim.state.builtInHold).toBeNull();
    expect(sim.state.builtInHolds[0]).toMatchObject({ endedAt: at(1000), early: true });
    expect(tAt(sim.state, at(1060))).toBe(-840);
  });

  it('end without resuming the clock when an unplanned hold is open', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.advance(at(1000));
    sim.ok(range, { type: 'hold:call', category: 'range', reason: 'Walker on the east track' }, at(1100));
    sim.advance(at(1600));
    expect(sim.state.builtInHold).toBeNull();
    expect(sim.state.status).toBe('holding');
    expect(tAt(sim.state, at(1700))).toBe(-900);
    sim.ok(range, { type: 'hold:clear', holdId: 'h1' }, at(1700));
    sim.ok(conductor, { type: 'count:resume' }, at(1700));
    expect(tAt(sim.state, at(1710))).toBe(-890);
  });
});

describe('recycle', () => {
  it('returns the clock to an earlier time and reopens the steps after it, holding until resumed', () => {
    const sim = new Sim().toAfterPoll();
    expect(sim.state.steps.s5.status).toBe('done');
    // T-10:00 at START + 1800 s; at START + 1850 s the clock reads -550.
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'LOX boil-off higher than planned' }, at(1850));
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(1900));
    const later = sim.command(conductor, { type: 'count:recycle', toSeconds: -500, reason: 'top up' }, at(1900));
    expect(later).toMatchObject({ ok: false, status: 400 });
    if (!later.ok) expect(later.error).toContain('later than the clock (T-9:10)');

    sim.ok(conductor, { type: 'count:recycle', toSeconds: -1500, reason: 'Top up the LOX tank' }, at(1900));
    expect(tAt(sim.state, at(2000))).toBe(-1500);
    expect(sim.state.status).toBe('holding');
    expect(sim.state.recycles).toEqual([{ at: at(1900), fromT: -550, toT: -1500, reason: 'Top up the LOX tank', by: { userId: 1, name: 'Ines Marlow' } }]);
    // Steps at or before T-25:00 stay done; the reading at T-20:00 and everything after come round again.
    expect(sim.state.steps.s1.status).toBe('done');
    expect(sim.state.steps.s2.status).toBe('done');
    expect(sim.state.steps.s3).toMatchObject({ status: 'pending', readings: [], reopened: 1 });
    expect(['s4', 's5'].map((k) => sim.state.steps[k].status)).toEqual(['pending', 'pending']);

    sim.ok(conductor, { type: 'count:resume' }, at(2000));
    // 300 s from -1500 to -1200.
    const again = sim.advance(at(2300));
    expect(again.map((e) => [e.type, e.at])).toEqual([['step:reached', at(2300)]]);
    expect(sim.state.steps.s3.status).toBe('current');
  });

  it('refuses to resume a hold called in terminal count and names the time to recycle to', () => {
    const sim = new Sim().toAfterPoll();
    sim.ok(daq, { type: 'step:complete', stepKey: 's6' }, at(2120));
    // T-0:30: 1770 s of running clock after the start plus the 600 s built-in hold = START + 2370 s.
    sim.ok(prop, { type: 'hold:call', category: 'hardware', reason: 'Chamber pressure transducer dropped out' }, at(2370));
    expect(sim.state.hold?.calledAtT).toBe(-30);
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(2400));
    const refused = sim.command(conductor, { type: 'count:resume' }, at(2400));
    expect(refused).toEqual({
      ok: false,
      status: 409,
      error: 'The count held at T-0:30, inside terminal count (from T-1:00): it cannot resume from there. Recycle to T-10:00 or earlier, then resume.',
    });
    sim.ok(conductor, { type: 'count:recycle', reason: 'Transducer replaced' }, at(2500));
    expect(tAt(sim.state, at(2500))).toBe(-600);
    sim.ok(conductor, { type: 'count:resume' }, at(2500));
    expect(sim.state.status).toBe('counting');
  });
});

describe('projected T-0', () => {
  it('adds the built-in holds still ahead', () => {
    const sim = new Sim();
    // Before the start: 1800 s of count and a 600 s built-in hold.
    expect(projectedT0(sim.state, at(-10))).toBe(at(-10) + (1800 + 600) * 1000);
    sim.ok(conductor, { type: 'count:start' }, START);
    expect(projectedT0(sim.state, START)).toBe(at(2400));
    // Inside the built-in hold at START + 1000 s: 900 s of count and 500 s of hold left; the same T-0.
    sim.advance(at(1000));
    expect(projectedT0(sim.state, at(1000))).toBe(at(1000 + 900 + 500));
    // After it, no built-in hold ahead: START + 1600 s with T = -800.
    sim.advance(at(1600));
    expect(projectedT0(sim.state, at(1600))).toBe(at(1600 + 800));
  });

  it('slides with now during an unplanned hold and warns when it passes the window', () => {
    const sim = new Sim(kestrelPlan({ windowEnd: at(2450) }));
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.advance(at(1600));
    sim.ok(range, { type: 'hold:call', category: 'weather', reason: 'Gusts above the stand limit' }, at(1600));
    expect(projectedT0(sim.state, at(1600))).toBe(at(2400));
    expect(windowWarning(sim.state, at(1600))).toBeNull();
    expect(projectedT0(sim.state, at(1700))).toBe(at(2500));
    expect(windowWarning(sim.state, at(1700))).toEqual({ projectedT0: at(2500), windowEnd: at(2450), lateBySeconds: 50 });
  });

  it('is null once scrubbed', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(safety, { type: 'count:scrub', category: 'weather', reason: 'Lightning within 10 km' }, at(100));
    expect(projectedT0(sim.state, at(200))).toBeNull();
  });
});

describe('hold time by category', () => {
  it('sums each hold from call to clearing, built-in holds apart, open holds to now', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(range, { type: 'hold:call', category: 'range', reason: 'Boat in the keep-out' }, at(100));
    sim.ok(range, { type: 'hold:clear', holdId: 'h1' }, at(220));
    sim.ok(conductor, { type: 'count:resume' }, at(250));
    // Resumed at T-28:20 (-1700): -900 comes 800 s later, at START + 1050 s; the hold runs to + 1650 s.
    sim.advance(at(1100));
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'Ethanol tank level low' }, at(1100));
    expect(holdTimeByCategory(sim.state, at(1130))).toEqual({ range: 120, propellant: 30, 'built-in': 80 });
  });
});
