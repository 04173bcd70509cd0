import { act, fireEvent, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { setSocketFactory } from '../../src/lib/socket';
import { CREATED } from '../domain/count-fixture';
import { countDetail, ev, FakeSocket, PROP, startedCount } from './count-fakes';
import { fakeApi, json } from './fake-api';
import { people, renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });

let socket: FakeSocket;

function open(as: (typeof people)[keyof typeof people], events = startedCount(), path = '/counts/5') {
  socket = new FakeSocket(events);
  setSocketFactory(() => socket.asSocket());
  fakeApi({ 'GET /api/auth/me': json(200, as), 'GET /api/setup': setup, 'GET /api/counts/5': json(200, countDetail(events)) });
  return renderApp(path);
}

beforeEach(() => {
  Object.defineProperty(navigator, 'vibrate', { value: vi.fn(), configurable: true, writable: true });
});

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
  setSocketFactory();
});

describe('the conductor console', () => {
  it('shows a hold and its reason when hold:called arrives, and logs it once however often it is pushed', async () => {
    open(people.admin);
    expect(await screen.findByRole('timer')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Conductor console' })).toHaveAttribute('aria-current', 'page');
    expect(screen.queryByRole('region', { name: 'Hold' })).not.toBeInTheDocument();
    expect(socket.emitted.find((e) => e.event === 'count:join')?.payload).toEqual({ countId: 5, sinceSeq: 0 });

    const hold = ev(5, 'hold:called', { holdId: 'H1', category: 'propellant', reason: 'Vent valve slow to close', source: 'person', calledByStation: 'PROP' }, { actor: PROP, station: 'PROP' });
    act(() => socket.push(hold));
    act(() => socket.push(hold));

    const banner = await screen.findByRole('region', { name: 'Hold' });
    expect(within(banner).getByText('Propellant: Vent valve slow to close')).toBeInTheDocument();
    expect(within(banner).getByText(/H1 called by PROP \(Rowan Fenn\)/)).toBeInTheDocument();
    // Only someone manning PROP (or the safety officer) clears PROP's hold.
    expect(within(banner).queryByRole('button', { name: /Clear hold/ })).not.toBeInTheDocument();
    expect(screen.getByText('HOLDING')).toBeInTheDocument();
    const log = screen.getByRole('region', { name: 'Count log' });
    expect(within(log).getAllByText(/HOLD H1 called by PROP \(Rowan Fenn\) — Propellant: Vent valve slow to close/)).toHaveLength(1);
  });
});

describe('the conductor’s controls', () => {
  it('start the count at the plan’s start, or pick it up at a later T the conductor types; a bad T sends nothing', async () => {
    const user = userEvent.setup();
    const created = [ev(1, 'count:created', (await import('../domain/count-fixture')).kestrelPlan(), { actor: { userId: 1, name: 'Avery Quill' } })];
    open(people.admin, created);
    await user.click(await screen.findByRole('button', { name: 'Start the count' }));
    const confirm = screen.getByRole('group', { name: 'Confirm: Start the count' });
    const field = within(confirm).getByLabelText('Start at');
    expect(field).toHaveValue('T-30:00');

    await user.clear(field);
    await user.type(field, 'soon');
    await user.click(within(confirm).getByRole('button', { name: 'Yes, start' }));
    expect(socket.commands()).toEqual([]);
    expect(within(confirm).getAllByText(/Write a count time like T-30:00/).length).toBeGreaterThan(0);

    await user.clear(field);
    await user.type(field, 'T-10:00');
    await user.click(within(confirm).getByRole('button', { name: 'Yes, start' }));
    expect(socket.commands()).toEqual([expect.objectContaining({ type: 'count:start', fromSeconds: -600 })]);
  });
});

describe('the conductor in safing', () => {
  it('can still open a poll (a safing go/no-go) and close safing, but not call a hold', async () => {
    const events = [...startedCount()];
    events.push(ev(events.length + 1, 'count:scrubbed', { category: 'weather', reason: 'Crosswind above the stand limit' }, { actor: { userId: 1, name: 'Avery Quill' } }));
    open(people.admin, events);
    expect(await screen.findByRole('button', { name: 'Close safing' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Open a poll' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Call a hold' })).not.toBeInTheDocument();
  });
});

describe('the clock on a device whose own clock is wrong', () => {
  it('shows the server’s T from the offset the clock:sync exchange measured, not the device’s time', async () => {
    // The count started at CREATED + 2 s at T-30:00; on the server it is now 100 s later: T-28:20.
    const serverNow = CREATED + 2000 + 100_000;
    // The phone's clock is 7.3 s slow; left uncorrected it would show T-28:27.
    vi.useFakeTimers({ toFake: ['Date'], now: serverNow - 7300 });
    socket = new FakeSocket(startedCount());
    socket.serverAheadMs = 7300;
    setSocketFactory(() => socket.asSocket());
    fakeApi({ 'GET /api/auth/me': json(200, people.operator), 'GET /api/setup': setup, 'GET /api/counts/5': json(200, countDetail(socket.events)) });
    renderApp('/counts/5');
    const timer = await screen.findByRole('timer');
    expect(socket.emitted.filter((e) => e.event === 'clock:sync').length).toBeGreaterThan(0);
    await vi.waitFor(() => expect(timer).toHaveTextContent('T-00:28:20'));
  });
});

describe('the station panel', () => {
  it('offers GO and NO-GO only while a poll asks its station, and sends the answer as a count:command', async () => {
    const user = userEvent.setup();
    open(people.operator);
    expect(await screen.findByRole('region', { name: 'Your steps' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Station PROP' })).toHaveAttribute('aria-current', 'page');
    expect(screen.queryByRole('button', { name: 'GO' })).not.toBeInTheDocument();

    act(() => socket.push(ev(5, 'poll:opened', { pollId: 'P1', stations: ['RANGE'], stepKey: null, question: 'Range clear?', timeoutSeconds: 60 }, { actor: PROP })));
    expect(await screen.findByText('Poll P1 is open for RANGE: PROP is not asked.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'GO' })).not.toBeInTheDocument();
    expect(navigator.vibrate).not.toHaveBeenCalled();

    act(() => socket.push(ev(6, 'poll:closed', { pollId: 'P1', result: 'go', nogo: [], missing: [], lost: [] })));
    act(() => socket.push(ev(7, 'poll:opened', { pollId: 'P2', stations: ['PROP', 'DAQ'], stepKey: null, question: 'Go for terminal count?', timeoutSeconds: 60 })));
    const asked = await screen.findByRole('region', { name: 'Your go/no-go' });
    expect(within(asked).getByText('Go for terminal count?')).toBeInTheDocument();
    expect(navigator.vibrate).toHaveBeenCalledTimes(1);

    await user.click(within(asked).getByRole('button', { name: 'GO' }));
    const sent = socket.commands();
    expect(sent).toHaveLength(1);
    expect(sent[0]).toMatchObject({ type: 'poll:answer', pollId: 'P2', station: 'PROP', answer: 'go' });
    expect(typeof sent[0].commandId).toBe('string');
  });

  it('asks for a reason before sending NO-GO', async () => {
    const user = userEvent.setup();
    open(people.operator);
    await screen.findByRole('region', { name: 'Your steps' });
    act(() => socket.push(ev(5, 'poll:opened', { pollId: 'P1', stations: ['PROP'], stepKey: null, question: 'Go for fill?', timeoutSeconds: 60 })));
    const asked = await screen.findByRole('region', { name: 'Your go/no-go' });
    await user.click(within(asked).getByRole('button', { name: 'NO-GO' }));
    await user.click(within(asked).getByRole('button', { name: 'Send NO-GO' }));
    expect(within(asked).getByText('Say why you are no-go')).toBeInTheDocument();
    expect(socket.commands()).toHaveLength(0);

    await user.type(within(asked).getByLabelText('Why no-go?'), 'Vent valve slow');
    await user.click(within(asked).getByRole('button', { name: 'Send NO-GO' }));
    expect(socket.commands()).toEqual([expect.objectContaining({ type: 'poll:answer', pollId: 'P1', station: 'PROP', answer: 'nogo', reason: 'Vent valve slow' })]);
  });

  it('opens the hold form only after HOLD has been held down for 1.5 s, by pointer or by keyboard', async () => {
    open(people.operator);
    await screen.findByRole('region', { name: 'Your steps' });
    const hold = screen.getByRole('button', { name: /HOLD/ });
    vi.useFakeTimers();

    // A press let go early does nothing.
    fireEvent.pointerDown(hold, { pointerId: 1 });
    act(() => vi.advanceTimersByTime(1000));
    expect(screen.getByText(/Keep holding/)).toBeInTheDocument();
    fireEvent.pointerUp(hold, { pointerId: 1 });
    act(() => vi.advanceTimersByTime(2000));
    expect(screen.queryByRole('form', { name: 'Call a hold from PROP' })).not.toBeInTheDocument();

    fireEvent.pointerDown(hold, { pointerId: 1 });
    act(() => vi.advanceTimersByTime(1400));
    expect(screen.queryByRole('form', { name: 'Call a hold from PROP' })).not.toBeInTheDocument();
    act(() => vi.advanceTimersByTime(100));
    expect(screen.getByRole('form', { name: 'Call a hold from PROP' })).toBeInTheDocument();
    fireEvent.click(screen.getByRole('button', { name: 'Cancel' }));

    const again = screen.getByRole('button', { name: /HOLD/ });
    fireEvent.keyDown(again, { key: ' ' });
    act(() => vi.advanceTimersByTime(1499));
    expect(screen.queryByRole('form', { name: 'Call a hold from PROP' })).not.toBeInTheDocument();
    act(() => vi.advanceTimersByTime(1));
    expect(screen.getByRole('form', { name: 'Call a hold from PROP' })).toBeInTheDocument();
    expect(socket.commands()).toHaveLength(0);
  });

  it('queues commands while the connection is down and sends them on reconnect with the same commandId', async () => {
    const user = userEvent.setup();
    const events = [...startedCount(), ev(5, 'step:reached', { stepKey: 's3' })];
    open(people.operator, events);
    await screen.findByRole('region', { name: 'Your steps' });

    // Sent, but the answer never comes back before the connection drops.
    await user.click(screen.getByRole('button', { name: 'Mark step done' }));
    const first = socket.commands();
    expect(first).toEqual([expect.objectContaining({ type: 'step:complete', stepKey: 's2' })]);

    act(() => socket.drop());
    expect(await screen.findByText('Reconnecting…')).toBeInTheDocument();
    await user.type(screen.getByLabelText('Reading (bar)'), '9.5');
    await user.click(screen.getByRole('button', { name: 'Record reading' }));
    expect(socket.commands()).toHaveLength(1);
    expect(screen.getByText('2 commands waiting to send')).toBeInTheDocument();

    let seq = 5;
    socket.answerCommand = (command) => {
      seq += 1;
      const e = command.type === 'step:complete' ? ev(seq, 'step:completed', { stepKey: 's2' }, { actor: PROP, station: 'PROP' }) : ev(seq, 'reading:recorded', { stepKey: 's3', value: 9.5, unit: 'bar', inLimits: true, message: '9.5 bar, within 2 to 14 bar' }, { actor: PROP, station: 'PROP' });
      socket.events.push(e);
      return { data: { events: [e] } };
    };
    const joinsBefore = socket.emitted.filter((e) => e.event === 'count:join').length;
    act(() => socket.restore());

    const joins = socket.emitted.filter((e) => e.event === 'count:join');
    expect(joins).toHaveLength(joinsBefore + 1);
    expect(joins.at(-1)!.payload).toEqual({ countId: 5, sinceSeq: 5 });
    const after = socket.commands().slice(1);
    expect(after.map((c) => c.type)).toEqual(['step:complete', 'reading:record']);
    expect(after[0].commandId).toBe(first[0].commandId);
    expect(after[1]).toMatchObject({ stepKey: 's3', value: 9.5 });
    expect(await screen.findByText('Connected')).toBeInTheDocument();
    expect(screen.queryByText(/waiting to send/)).not.toBeInTheDocument();
  });
});
