import { describe, expect, it } from 'vitest';
import { decide, initialCountState, redlineReason, reduce, replay, type CountEvent, type CountState } from '../../src/domain/count';
import { at, auditor, conductor, daq, kestrelPlan, prop, range, safety, Sim, START } from './count-fixture';

function started(): Sim {
  const sim = new Sim();
  sim.ok(conductor, { type: 'count:start' }, START);
  return sim;
}

describe('who may do what', () => {
  it('only the conductor starts the count, once', () => {
    const sim = new Sim();
    expect(sim.command(prop, { type: 'count:start' }, START)).toEqual({ ok: false, status: 403, error: 'Only the test conductor starts the count.' });
    sim.ok(conductor, { type: 'count:start' }, START);
    expect(sim.command(conductor, { type: 'count:start' }, at(1))).toEqual({ ok: false, status: 409, error: 'The count has already started.' });
  });

  it('an auditor watches: they cannot call a hold', () => {
    const sim = started();
    const d = sim.command(auditor, { type: 'hold:call', category: 'other', reason: 'I saw smoke' }, at(50));
    expect(d).toEqual({ ok: false, status: 403, error: 'Only the crew can call a hold: you are watching this count.' });
    expect(sim.state.status).toBe('counting');
  });

  it('anyone on the crew calls a hold at any time; the safety officer without a station too', () => {
    const sim = started();
    sim.ok(daq, { type: 'hold:call', category: 'data', reason: 'Logger not writing' }, at(50));
    sim.ok(safety, { type: 'hold:call', category: 'personnel', reason: 'Visitor inside the fence' }, at(60));
    expect(sim.state.holds.map((h) => [h.holdId, h.calledByStation, h.source])).toEqual([
      ['h1', 'DAQ', 'person'],
      ['h2', null, 'person'],
    ]);
    expect(sim.command(daq, { type: 'hold:call', category: 'data', reason: '   ' }, at(61))).toEqual({ ok: false, status: 400, error: 'Say why you are calling the hold.' });
    expect(sim.command(daq, { type: 'hold:call', category: 'data', reason: 'x', station: 'PROP' }, at(61))).toMatchObject({ ok: false, status: 403 });
  });

  it('a hold is cleared by its station or the safety officer; a system hold by the conductor or safety', () => {
    const sim = started();
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'Ethanol leak at QD' }, at(50));
    expect(sim.command(range, { type: 'hold:clear', holdId: 'h1' }, at(60))).toEqual({
      ok: false,
      status: 403,
      error: 'Only someone manning PROP, which called it, or the safety officer can clear hold h1.',
    });
    expect(sim.command(conductor, { type: 'hold:clear', holdId: 'h1' }, at(60))).toMatchObject({ ok: false, status: 403 });
    sim.ok(safety, { type: 'hold:clear', holdId: 'h1' }, at(70));
    expect(sim.command(prop, { type: 'hold:clear', holdId: 'h1' }, at(71))).toEqual({ ok: false, status: 409, error: 'Hold h1 is already cleared.' });
    // A redline hold belongs to no one person.
    sim.ok(conductor, { type: 'count:resume' }, at(80));
    sim.ok(conductor, { type: 'step:complete', stepKey: 's1' }, at(81));
    sim.advance(at(700));
    sim.ok(prop, { type: 'reading:record', stepKey: 's3', value: 15 }, at(700));
    expect(sim.state.hold?.source).toBe('redline');
    expect(sim.command(prop, { type: 'hold:clear', holdId: 'h2' }, at(710))).toMatchObject({ ok: false, status: 403 });
    sim.ok(conductor, { type: 'hold:clear', holdId: 'h2' }, at(720));
  });

  it('resume before every hold is cleared is refused with the holds named', () => {
    const sim = started();
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'vent valve slow' }, at(50));
    sim.ok(range, { type: 'hold:call', category: 'range', reason: 'Road gate open' }, at(55));
    sim.ok(prop, { type: 'hold:clear', holdId: 'h1' }, at(60));
    expect(sim.state.hold?.holdId).toBe('h2');
    expect(sim.command(conductor, { type: 'count:resume' }, at(70))).toEqual({
      ok: false,
      status: 409,
      error: 'Clear every hold first: h2 (RANGE: Road gate open) is still open.',
    });
    expect(sim.command(range, { type: 'count:resume' }, at(70))).toMatchObject({ ok: false, status: 403 });
    sim.ok(range, { type: 'hold:clear', holdId: 'h2' }, at(80));
    sim.ok(conductor, { type: 'count:resume' }, at(90));
    expect(sim.state.holds.every((h) => h.endedAt === at(90))).toBe(true);
  });

  it('an operator completes only the steps of the stations they man, and only once reached', () => {
    const sim = started();
    expect(sim.command(range, { type: 'step:complete', stepKey: 's2' }, at(5))).toEqual({
      ok: false,
      status: 403,
      error: '"Verify LOX vent valve open" belongs to PROP; you man RANGE.',
    });
    expect(sim.command(daq, { type: 'step:complete', stepKey: 's6' }, at(5))).toEqual({
      ok: false,
      status: 409,
      error: '"Start data recording" has not been reached yet: it comes at T-5:00.',
    });
    sim.ok(prop, { type: 'step:complete', stepKey: 's2' }, at(5));
    expect(sim.state.steps.s2).toMatchObject({ status: 'done', completedAt: at(5), completedBy: { userId: 2, name: 'Tobias Renk' } });
    expect(sim.state.currentSteps).toEqual({ TC: ['s1'] });
    expect(sim.command(prop, { type: 'step:complete', stepKey: 's3' }, at(700))).toMatchObject({ ok: false, status: 400 });
  });
});

describe('readings and redlines', () => {
  it('an in-limits reading completes its step', () => {
    const sim = started();
    sim.advance(at(600));
    const events = sim.ok(prop, { type: 'reading:record', stepKey: 's3', value: 9.5 }, at(620));
    expect(events.map((e) => e.type)).toEqual(['reading:recorded', 'step:completed']);
    expect(sim.state.steps.s3.readings).toEqual([
      { value: 9.5, unit: 'bar', inLimits: true, message: '9.5 bar, within 2 to 14 bar', at: at(620), by: { userId: 2, name: 'Tobias Renk' } },
    ]);
  });

  it('a reading past its redline holds the count with the value, unit and limit', () => {
    const sim = started();
    sim.advance(at(600));
    const events = sim.ok(prop, { type: 'reading:record', stepKey: 's3', value: 14.6 }, at(620));
    expect(events.map((e) => e.type)).toEqual(['reading:recorded', 'hold:called']);
    expect(sim.state.hold).toMatchObject({ source: 'redline', calledByStation: 'PROP', reason: 'redline: LOX tank pressure: 14.6 bar above 14' });
    expect(sim.state.steps.s3.status).toBe('current');
    expect(redlineReason({ key: 's3', instruction: 'LOX tank pressure', unit: 'bar', min: 2, max: 14 }, 1.5)).toBe('redline: LOX tank pressure: 1.5 bar below 2');
    expect(redlineReason({ key: 's3', instruction: 'LOX tank pressure', unit: 'bar', min: 2, max: 14 }, 14)).toBeNull();
  });
});

describe('scrub, completion and safing', () => {
  it('a scrub moves to safing; safing closes only when its steps are done', () => {
    const sim = started();
    expect(sim.command(prop, { type: 'count:scrub', category: 'weather', reason: 'Wind' }, at(30))).toMatchObject({ ok: false, status: 403 });
    sim.ok(conductor, { type: 'count:scrub', category: 'weather', reason: 'Crosswind above the stand limit' }, at(30));
    expect(sim.state.status).toBe('safing');
    expect(sim.state.scrub).toMatchObject({ atT: -1770, category: 'weather' });
    expect(sim.state.clock.running).toBe(false);
    expect(sim.state.currentSteps).toEqual({ TC: ['s1', 'x2'], PROP: ['s2', 'x1'] });
    expect(sim.command(prop, { type: 'hold:call', category: 'other', reason: 'x' }, at(31))).toMatchObject({ ok: false, status: 409 });
    const early = sim.command(safety, { type: 'count:close-safing' }, at(40));
    expect(early).toEqual({
      ok: false,
      status: 409,
      error: 'Safing is not finished: 2 steps still open (PROP: Vent the LOX tank; TC: Declare the stand safe).',
    });
    sim.ok(prop, { type: 'step:complete', stepKey: 'x1' }, at(100));
    sim.ok(conductor, { type: 'step:complete', stepKey: 'x2' }, at(200));
    sim.ok(safety, { type: 'count:close-safing' }, at(210));
    expect(sim.state.status).toBe('scrubbed');
    expect(sim.command(conductor, { type: 'count:start' }, at(300))).toMatchObject({ ok: false, status: 409 });
  });

  it('completion needs T-0; after it the count safes and closes complete', () => {
    const sim = new Sim().toAfterPoll();
    expect(sim.command(conductor, { type: 'count:complete' }, at(2000))).toMatchObject({ ok: false, status: 409 });
    sim.advance(at(2420));
    expect(sim.state.t0At).toBe(at(2400));
    sim.ok(conductor, { type: 'count:complete' }, at(2430));
    expect(sim.state.status).toBe('safing');
    sim.ok(prop, { type: 'step:complete', stepKey: 'x1' }, at(2500));
    sim.ok(conductor, { type: 'step:complete', stepKey: 'x2' }, at(2510));
    sim.ok(conductor, { type: 'count:close-safing' }, at(2520));
    expect(sim.state).toMatchObject({ status: 'complete', completedAt: at(2430), closedAt: at(2520) });
  });
});

describe('a go/no-go poll in safing', () => {
  /** The fixture's plan with a last safing step that is a poll: open the range. */
  function withSafingPoll(): Sim {
    const base = kestrelPlan();
    const poll = { ...base.steps[base.steps.length - 1]!, key: 'x3', kind: 'poll' as const, station: 'TC', instruction: 'Go/no-go to open the range', stations: ['PROP', 'RANGE'], index: base.steps.length };
    const sim = new Sim(kestrelPlan({ steps: [...base.steps, poll] }));
    sim.ok(conductor, { type: 'count:start' }, START);
    sim.ok(conductor, { type: 'count:scrub', category: 'weather', reason: 'Crosswind above the stand limit' }, at(30));
    return sim;
  }

  it('is asked by the conductor when safing is ready for it, and its pass completes the step so safing can close', () => {
    const sim = withSafingPoll();
    expect(sim.state.status).toBe('safing');
    // Nothing opens it by itself: the stand is not safe yet when safing starts.
    sim.advance(at(600));
    expect(sim.state.poll).toBeNull();
    expect(sim.command(prop, { type: 'poll:open', stepKey: 'x3' }, at(610))).toMatchObject({ ok: false, status: 403 });
    sim.ok(prop, { type: 'step:complete', stepKey: 'x1' }, at(620));
    sim.ok(conductor, { type: 'step:complete', stepKey: 'x2' }, at(630));
    sim.ok(conductor, { type: 'poll:open', stepKey: 'x3' }, at(640));
    const pollId = sim.state.poll!.pollId;
    sim.ok(prop, { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' }, at(650));
    sim.ok(range, { type: 'poll:answer', pollId, station: 'RANGE', answer: 'go' }, at(655));
    expect(sim.state.poll).toBeNull();
    expect(sim.state.steps.x3).toMatchObject({ status: 'done', completedAt: at(655) });
    sim.ok(conductor, { type: 'count:close-safing' }, at(660));
    expect(sim.state.status).toBe('scrubbed');
  });

  it('times out in safing without holding anything, and can be asked again', () => {
    const sim = withSafingPoll();
    sim.ok(conductor, { type: 'poll:open', stepKey: 'x3', timeoutSeconds: 30 }, at(100));
    sim.advance(at(200));
    expect(sim.state.polls.at(-1)).toMatchObject({ stepKey: 'x3', result: 'nogo', missing: ['PROP', 'RANGE'], closedAt: at(130) });
    expect(sim.state.status).toBe('safing');
    expect(sim.state.holds).toEqual([]);
    expect(sim.state.steps.x3!.status).toBe('current');
    sim.ok(conductor, { type: 'poll:open', stepKey: 'x3' }, at(210));
    expect(sim.state.poll).toMatchObject({ stepKey: 'x3', openedAt: at(210) });
  });
});

describe('the reducer', () => {
  function deepFreeze<T>(value: T): T {
    if (value && typeof value === 'object') {
      Object.values(value).forEach(deepFreeze);
      Object.freeze(value);
    }
    return value;
  }

  it('never changes the state it is given', () => {
    const sim = new Sim().toAfterPoll();
    sim.ok(prop, { type: 'hold:call', category: 'propellant', reason: 'LOX boil-off' }, at(1850));
    let state: CountState = initialCountState();
    for (const e of sim.events) state = reduce(deepFreeze(state), deepFreeze(e));
    expect(state).toEqual(sim.state);
  });

  it('ignores an event it has already folded', () => {
    const sim = started();
    const again = reduce(sim.state, sim.events[sim.events.length - 1]);
    expect(again).toBe(sim.state);
  });

  it('decide refuses everything on a count with no plan', () => {
    const d = decide(initialCountState(), { type: 'count:start' }, { now: START, actor: { userId: 1, name: 'x', roles: ['conductor'] }, mannedStations: [] });
    expect(d).toEqual({ ok: false, status: 409, error: 'This count has no plan yet.' });
  });

  it('replays the whole log into the live state', () => {
    const sim = new Sim().toAfterPoll();
    const events: CountEvent[] = sim.events;
    expect(replay(events)).toEqual(sim.state);
  });
});
