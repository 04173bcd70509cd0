import { describe, expect, it } from 'vitest';
import { at, conductor, daq, prop, range, Sim, START } from './count-fixture';

// The poll step at T-10:00 is reached at START + 1800 s: 1200 s of clock plus the 600 s built-in hold at T-15:00.
function atPoll(): Sim {
  const sim = new Sim();
  sim.ok(conductor, { type: 'count:start' }, START);
  sim.advance(at(1800));
  return sim;
}

describe('go/no-go polls', () => {
  it('open by themselves when the clock reaches a poll step', () => {
    const sim = atPoll();
    expect(sim.state.poll).toMatchObject({
      pollId: 'p1',
      stepKey: 's5',
      question: 'Go/no-go for terminal count',
      stations: ['PROP', 'RANGE', 'DAQ'],
      openedAt: at(1800),
      timeoutSeconds: 60,
      answers: {},
    });
  });

  it('pass when every station answers go, closing with the last answer and completing the step', () => {
    const sim = atPoll();
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'go' }, at(1803));
    sim.ok(range, { type: 'poll:answer', pollId: 'p1', station: 'RANGE', answer: 'go' }, at(1805));
    const last = sim.ok(daq, { type: 'poll:answer', pollId: 'p1', station: 'DAQ', answer: 'go' }, at(1809));
    expect(last.map((e) => e.type)).toEqual(['poll:answered', 'poll:closed']);
    expect(sim.state.poll).toBeNull();
    expect(sim.state.polls[0]).toMatchObject({ result: 'go', nogo: [], missing: [], lost: [], closedAt: at(1809) });
    expect(sim.state.polls[0].answers.RANGE).toMatchObject({ answer: 'go', responseMs: 5000 });
    expect(sim.state.steps.s5).toMatchObject({ status: 'done', completedBy: null });
    expect(sim.state.stations.DAQ.lastAnswer).toEqual({ pollId: 'p1', answer: 'go', at: at(1809) });
    expect(sim.state.status).toBe('counting');
  });

  it('fail on a NO-GO and put the count on hold with the reason', () => {
    const sim = atPoll();
    const bare = sim.command(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'nogo' }, at(1802));
    expect(bare).toEqual({ ok: false, status: 400, error: 'Say why PROP is no-go.' });
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'nogo', reason: 'vent valve slow' }, at(1803));
    sim.ok(range, { type: 'poll:answer', pollId: 'p1', station: 'RANGE', answer: 'go' }, at(1804));
    const last = sim.ok(daq, { type: 'poll:answer', pollId: 'p1', station: 'DAQ', answer: 'go' }, at(1806));
    expect(last.map((e) => e.type)).toEqual(['poll:answered', 'poll:closed', 'hold:called']);
    expect(sim.state.status).toBe('holding');
    expect(sim.state.hold).toMatchObject({ source: 'poll', reason: 'poll failed: PROP no-go: vent valve slow', calledAtT: -594 });
    expect(sim.state.steps.s5.status).toBe('current');
  });

  it('fail on timeout when a station has not answered', () => {
    const sim = atPoll();
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'go' }, at(1810));
    sim.ok(daq, { type: 'poll:answer', pollId: 'p1', station: 'DAQ', answer: 'go' }, at(1812));
    expect(sim.advance(at(1859))).toEqual([]);
    const closed = sim.advance(at(1900));
    expect(closed.map((e) => [e.type, e.at])).toEqual([
      ['poll:closed', at(1860)],
      ['hold:called', at(1860)],
    ]);
    expect(sim.state.polls[0]).toMatchObject({ result: 'nogo', missing: ['RANGE'] });
    expect(sim.state.hold?.reason).toBe('poll failed: RANGE did not answer');
    // The clock stopped at the timeout, 60 s after T-10:00.
    expect(sim.state.clock.tSeconds).toBe(-540);
  });

  it('let an answer change until the poll closes', () => {
    const sim = atPoll();
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'nogo', reason: 'checking a reading' }, at(1801));
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'go' }, at(1820));
    sim.ok(range, { type: 'poll:answer', pollId: 'p1', station: 'RANGE', answer: 'go' }, at(1821));
    sim.ok(daq, { type: 'poll:answer', pollId: 'p1', station: 'DAQ', answer: 'go' }, at(1822));
    expect(sim.state.polls[0].result).toBe('go');
    const late = sim.command(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'nogo', reason: 'too late' }, at(1823));
    expect(late).toEqual({ ok: false, status: 409, error: 'No poll is open: the poll has closed.' });
  });

  it('refuse an operator answering for another station', () => {
    const sim = atPoll();
    const d = sim.command(prop, { type: 'poll:answer', pollId: 'p1', station: 'RANGE', answer: 'go' }, at(1801));
    expect(d).toEqual({ ok: false, status: 403, error: 'That answer belongs to RANGE; you man PROP.' });
    expect(sim.state.poll?.answers).toEqual({});
  });

  it('cannot pass with a station shown as lost, whatever it answered', () => {
    const sim = atPoll();
    sim.append([{ type: 'station:connected', payload: { station: 'DAQ' }, actor: null, station: 'DAQ' }], at(1790));
    sim.ok(daq, { type: 'poll:answer', pollId: 'p1', station: 'DAQ', answer: 'go' }, at(1801));
    sim.append([{ type: 'station:lost', payload: { station: 'DAQ' }, actor: null, station: 'DAQ' }], at(1802));
    expect(sim.state.stations.DAQ).toMatchObject({ presence: 'lost', since: at(1802) });
    sim.ok(prop, { type: 'poll:answer', pollId: 'p1', station: 'PROP', answer: 'go' }, at(1803));
    sim.ok(range, { type: 'poll:answer', pollId: 'p1', station: 'RANGE', answer: 'go' }, at(1804));
    expect(sim.state.polls[0]).toMatchObject({ result: 'nogo', lost: ['DAQ'] });
    expect(sim.state.hold?.reason).toBe('poll failed: DAQ lost connection');
  });

  it('can be opened by the conductor alone, one at a time', () => {
    const sim = atPoll();
    const byOperator = sim.command(prop, { type: 'poll:open', question: 'Ready?' }, at(1801));
    expect(byOperator).toMatchObject({ ok: false, status: 403 });
    const second = sim.command(conductor, { type: 'poll:open', question: 'Ready?' }, at(1830));
    expect(second).toEqual({ ok: false, status: 409, error: 'Poll p1 is still open: wait for its answers or its timeout (0:30 left).' });
  });

  it('re-poll a failed poll step after the hold, and the step completes when it passes', () => {
    const sim = atPoll();
    sim.advance(at(1860));
    sim.ok(conductor, { type: 'hold:clear', holdId: 'h1' }, at(1900));
    sim.ok(conductor, { type: 'count:resume' }, at(1900));
    sim.ok(conductor, { type: 'poll:open', stepKey: 's5' }, at(1901));
    expect(sim.state.poll).toMatchObject({ pollId: 'p2', stepKey: 's5', question: 'Go/no-go for terminal count', stations: ['PROP', 'RANGE', 'DAQ'] });
    for (const who of [prop, range, daq]) sim.ok(who, { type: 'poll:answer', pollId: 'p2', station: who.mans[0], answer: 'go' }, at(1905));
    expect(sim.state.steps.s5.status).toBe('done');
  });
});
