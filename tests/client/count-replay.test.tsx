import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { CREATED, kestrelPlan } from '../domain/count-fixture';
import { ev, PROP, TC } from './count-fakes';
import { fakeApi, json } from './fake-api';
import { people, renderApp } from './render-app';

afterEach(() => vi.unstubAllGlobals());

// Started at CREATED + 2 s at T-30:00 (-1800 s); a hold from +100 s to the resume at +160 s.
const events = [
  ev(1, 'count:created', kestrelPlan(), { actor: TC }),
  ev(2, 'count:started', {}, { actor: TC }),
  ev(3, 'step:reached', { stepKey: 's1' }),
  ev(4, 'hold:called', { holdId: 'h1', category: 'propellant', reason: 'LOX vent valve slow to close', source: 'person', calledByStation: 'PROP' }, { seconds: 100, actor: PROP, station: 'PROP' }),
  ev(5, 'hold:cleared', { holdId: 'h1' }, { seconds: 150, actor: PROP, station: 'PROP' }),
  ev(6, 'count:resumed', {}, { seconds: 160, actor: TC }),
];

function open(path: string) {
  fakeApi({
    'GET /api/auth/me': json(200, people.operator),
    'GET /api/setup': json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' }),
    'GET /api/counts/5/events': json(200, events),
  });
  return renderApp(path);
}

describe('the replay', () => {
  it('shows the count at the instant in the address, and jumps to the next hold with its reason and who called it', async () => {
    const user = userEvent.setup();
    const { router } = open(`/counts/5/replay?at=${CREATED + 50_000}`);
    // 48 s after the start: T-30:00 + 48 s.
    expect(await screen.findByRole('timer')).toHaveTextContent('T-00:29:12');
    expect(screen.queryByRole('region', { name: 'Hold' })).not.toBeInTheDocument();
    const log = screen.getByRole('region', { name: 'Count log' });
    expect(within(log).queryByText(/HOLD h1/)).not.toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Next hold' }));
    // The hold came 98 s after the start: T-28:22, and the clock stands there.
    expect(screen.getByRole('timer')).toHaveTextContent('T-00:28:22');
    const banner = screen.getByRole('region', { name: 'Hold' });
    expect(within(banner).getByText('Propellant: LOX vent valve slow to close')).toBeInTheDocument();
    expect(within(banner).getByText(/h1 called by PROP \(Rowan Fenn\)/)).toBeInTheDocument();
    expect(within(screen.getByRole('region', { name: 'Count log' })).getByText(/HOLD h1 called by PROP/)).toBeInTheDocument();
    // An anomaly can be reported at the instant shown, which is also the one in the address.
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get('at')).not.toBe(String(CREATED + 50_000)));
    const at = new URLSearchParams(router.state.location.search).get('at');
    expect(screen.getByRole('link', { name: 'Report anomaly at this instant' })).toHaveAttribute('href', `/anomalies/new?countId=5&at=${at}`);
  });

  it('shows the station board and each poll’s answers as they stood at the instant', async () => {
    const withPoll = [
      ...events,
      ev(7, 'station:connected', { station: 'PROP' }, { seconds: 170, actor: PROP, station: 'PROP' }),
      ev(8, 'poll:opened', { pollId: 'p1', stations: ['PROP', 'RANGE'], stepKey: null, question: 'Go for LOX load?', timeoutSeconds: 60 }, { seconds: 180, actor: TC }),
      ev(9, 'poll:answered', { pollId: 'p1', station: 'PROP', answer: 'go', reason: '', responseMs: 4000 }, { seconds: 184, actor: PROP, station: 'PROP' }),
      ev(10, 'poll:closed', { pollId: 'p1', result: 'nogo', nogo: [], missing: ['RANGE'], lost: [] }, { seconds: 240 }),
    ];
    fakeApi({
      'GET /api/auth/me': json(200, people.operator),
      'GET /api/setup': json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' }),
      'GET /api/counts/5/events': json(200, withPoll),
    });
    const first = renderApp(`/counts/5/replay?at=${CREATED + 190_000}`);
    // 6 s after it opened: PROP has answered GO in 4.0 s; RANGE is still waiting, 50 s left.
    const poll = await screen.findByRole('region', { name: 'Poll p1' });
    expect(within(poll).getByText('50 s left to answer')).toBeInTheDocument();
    const prop = within(poll).getByRole('row', { name: /PROP/ });
    expect(prop).toHaveTextContent('GO');
    expect(prop).toHaveTextContent('4.0 s');
    expect(within(poll).getByRole('row', { name: /RANGE/ })).toHaveTextContent('waiting');
    const board = screen.getByRole('region', { name: 'Stations' });
    expect(within(board).getByRole('row', { name: /PROP/ })).toHaveTextContent('connected');
    expect(within(board).getByRole('row', { name: /RANGE/ })).toHaveTextContent('not seen yet');

    // At the end of the log the poll has closed: the last poll shows it failed, RANGE never answered.
    first.unmount();
    renderApp('/counts/5/replay');
    const last = await screen.findByRole('region', { name: 'Last poll' });
    expect(within(last).getByText('Failed')).toBeInTheDocument();
    expect(within(last).getByRole('row', { name: /RANGE/ })).toHaveTextContent('no answer');
    expect(within(last).getByRole('row', { name: /PROP/ })).toHaveTextContent('GO');
  });

  it('goes to the instant the clock read a count time the auditor types', async () => {
    const user = userEvent.setup();
    open(`/counts/5/replay?at=${CREATED + 10_000}`);
    const field = await screen.findByLabelText('Go to a count time');
    await user.type(field, 'soon');
    await user.click(screen.getByRole('button', { name: 'Go' }));
    expect(screen.getAllByText(/Write a count time like T-30:00/).length).toBeGreaterThan(0);

    // Never reached in this log (it ends at T-28:22).
    await user.clear(field);
    await user.type(field, 'T-5:00');
    await user.click(screen.getByRole('button', { name: 'Go' }));
    expect(screen.getByText('The clock never read T-5:00 in this log.')).toBeInTheDocument();

    // T-28:22 is where the hold stopped the clock, 100 s after the count was created: who called it and why.
    await user.clear(field);
    await user.type(field, 'T-28:22');
    await user.click(screen.getByRole('button', { name: 'Go' }));
    expect(screen.getByRole('status')).toHaveTextContent(/The clock read T-28:22 once, at/);
    expect(screen.getByRole('timer')).toHaveTextContent('T-00:28:22');
    const banner = screen.getByRole('region', { name: 'Hold' });
    expect(within(banner).getByText('Propellant: LOX vent valve slow to close')).toBeInTheDocument();
    expect(within(banner).getByText(/h1 called by PROP \(Rowan Fenn\)/)).toBeInTheDocument();
  });

  it('marks the anomalies reported at instants of the count, jumps to the next one, and lists the holds by category', async () => {
    const user = userEvent.setup();
    const anomaly = { id: 9, ref: 'AN-009', title: 'LOX vent valve stuck half open', status: 'open', severityLabel: 'Serious', countId: 5, atMs: CREATED + 120_000, hazardIds: [] };
    fakeApi({
      'GET /api/auth/me': json(200, people.operator),
      'GET /api/setup': json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' }),
      'GET /api/counts/5/events': json(200, events),
      'GET /api/anomalies?countId=5': json(200, [anomaly]),
    });
    renderApp(`/counts/5/replay?at=${CREATED + 10_000}`);
    const holds = await screen.findByRole('list', { name: 'Holds on the timeline' });
    expect(within(holds).getByRole('button', { name: /h1 Propellant at/ })).toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Anomaly at this instant' })).not.toBeInTheDocument();

    await user.click(await screen.findByRole('button', { name: 'Next anomaly' }));
    // 120 s after the count was made: during the hold (100 s to 160 s), so the clock stands at T-28:22.
    expect(screen.getByRole('timer')).toHaveTextContent('T-00:28:22');
    const here = screen.getByRole('region', { name: 'Anomaly at this instant' });
    expect(within(here).getByRole('link', { name: 'AN-009: LOX vent valve stuck half open' })).toHaveAttribute('href', '/anomalies/9');

    // A hold in the list takes the replay to its call.
    await user.click(within(holds).getByRole('button', { name: /h1 Propellant at/ }));
    expect(screen.queryByRole('region', { name: 'Anomaly at this instant' })).not.toBeInTheDocument();
    expect(screen.getByRole('region', { name: 'Hold' })).toBeInTheDocument();
  });

  it('without an instant shows the end of the log: counting again after the resume', async () => {
    open('/counts/5/replay');
    expect(await screen.findByRole('timer')).toHaveTextContent('T-00:28:22');
    expect(screen.getByText('COUNTING')).toBeInTheDocument();
  });
});
