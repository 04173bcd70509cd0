import { render, screen, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import type { AnomalyDto } from '../../src/contract/anomalies';
import { SEVERITY_CATEGORIES } from '../../src/domain/hazards/matrix';
import { instantInputValue } from '../../src/features/anomalies/lib/format';
import { RevisionAnomalies } from '../../src/features/procedures/components/RevisionAnomalies';
import { fakeApi, json } from './fake-api';
import { kestrelHazards } from './hazards-fixtures';
import { renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
const safety = { id: 3, email: 'safety@ternvalley.test', name: 'Mara Oduya', roles: ['safety'] };
const operator = { id: 2, email: 'pad@ternvalley.test', name: 'Rowan Fenn', roles: ['operator'] };
const auditor = { id: 5, email: 'audit@ternvalley.test', name: 'Theo Brandt', roles: ['auditor'] };

const matrices = [{ id: 'mil-std-882e', name: 'Built-in 4 × 6 matrix', builtIn: true, isDefault: true, retired: false, severities: SEVERITY_CATEGORIES.map((s) => ({ ...s })) }];
const counts = [{ id: 7, name: 'Kestrel-2 hot fire 3', status: 'holding' }];
// An instant with milliseconds, as the replay's address carries it.
const AT = Date.UTC(2031, 4, 17, 13, 2, 41, 250);

function server(me: object, extra: Parameters<typeof fakeApi>[0] = {}) {
  return fakeApi({
    'GET /api/auth/me': json(200, me),
    'GET /api/setup': setup,
    'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
    'GET /api/counts': json(200, counts),
    'GET /api/risk-matrices': json(200, matrices),
    ...extra,
  });
}

function anomaly(overrides: Partial<AnomalyDto> = {}): AnomalyDto {
  return {
    id: 5,
    ref: 'AN-005',
    title: 'Fuel inlet pressure spike',
    status: 'open',
    matrixId: 'mil-std-882e',
    severity: 2,
    severityLabel: '2 Critical',
    countId: 7,
    countName: 'Kestrel-2 hot fire 3',
    at: new Date(AT).toISOString(),
    atMs: AT,
    tSeconds: -13.75,
    tText: 'T-0:14',
    countStatus: 'holding',
    hazardIds: [],
    openActions: 1,
    revisions: [],
    reportedBy: 'Rowan Fenn',
    createdAt: new Date(AT).toISOString(),
    description: 'The inlet transducer read a spike above its redline.',
    immediateActions: 'Held; line vented.',
    hazards: [],
    attachments: [],
    actions: [{ id: 11, description: 'Re-zero the inlet transducer', ownerId: 2, ownerName: 'Rowan Fenn', dueDate: '2031-05-20', status: 'open', createdAt: new Date(AT).toISOString() }],
    history: [{ id: 1, userName: 'Rowan Fenn', at: new Date(AT).toISOString(), text: 'Reported AN-005 “Fuel inlet pressure spike” in the count “Kestrel-2 hot fire 3” at T-0:14 (holding), severity 2 Critical.' }],
    closedAt: null,
    closedBy: null,
    ...overrides,
  };
}

const detailFakes = (a: AnomalyDto) => ({
  'GET /api/anomalies/5': () => json(200, a),
  'GET /api/hazards': json(200, [{ id: 1, code: 'HZ-001', title: 'LOX run tank overpressure' }]),
  'GET /api/procedures': json(200, [{ id: 1, name: 'Kestrel-2 hot fire', draft: null }]),
  'GET /api/anomalies/people': json(200, [
    { id: 2, name: 'Rowan Fenn' },
    { id: 3, name: 'Mara Oduya' },
  ]),
});

describe('the report form', () => {
  it('starts at the count and instant from the address and sends that instant to the millisecond', async () => {
    const user = userEvent.setup();
    const posts: unknown[] = [];
    server(operator, {
      'POST /api/anomalies': ({ body }) => {
        posts.push(JSON.parse(String(body)));
        return json(201, anomaly());
      },
      ...detailFakes(anomaly()),
    });
    renderApp(`/anomalies/new?countId=7&at=${AT}`);
    const form = await screen.findByRole('form', { name: 'Report an anomaly' });
    await within(form).findByRole('option', { name: 'Kestrel-2 hot fire 3' });
    expect(within(form).getByLabelText('Count')).toHaveValue('7');
    // Browsers and jsdom may add .000 to a datetime-local value with seconds.
    expect((within(form).getByLabelText('Instant of the count') as HTMLInputElement).value).toMatch(new RegExp(`^${instantInputValue(AT)}(\\.000)?$`));

    // Nothing filled in: the messages are under the fields and nothing is sent.
    await user.click(within(form).getByRole('button', { name: 'Report anomaly' }));
    expect(await within(form).findByText('Enter a title')).toBeInTheDocument();
    expect(within(form).getByText('Say what happened')).toBeInTheDocument();
    expect(within(form).getByText('Choose a severity')).toBeInTheDocument();
    expect(posts).toHaveLength(0);

    await user.type(within(form).getByLabelText('Title'), 'Fuel inlet pressure spike');
    await user.type(within(form).getByLabelText('What happened'), 'The inlet transducer read a spike above its redline.');
    await within(form).findByRole('option', { name: '2 Critical' });
    await user.selectOptions(within(form).getByLabelText('Severity'), '2');
    await user.click(within(form).getByRole('button', { name: 'Report anomaly' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Fuel inlet pressure spike' })).toBeInTheDocument();
    expect(posts).toEqual([
      { title: 'Fuel inlet pressure spike', description: 'The inlet transducer read a spike above its redline.', severity: 2, immediateActions: '', countId: 7, at: AT },
    ]);
  });

  it('puts the server’s refusal at the instant, and keeps what was typed', async () => {
    const user = userEvent.setup();
    const message = 'This instant is before the count was made. Choose an instant of its log.';
    server(operator, {
      'POST /api/anomalies': json(400, { error: 'Some fields are not valid.', code: 'instant_outside_count', details: [{ path: 'at', message }] }),
    });
    renderApp(`/anomalies/new?countId=7&at=${AT}`);
    const form = await screen.findByRole('form', { name: 'Report an anomaly' });
    await user.type(within(form).getByLabelText('Title'), 'Spike');
    await user.type(within(form).getByLabelText('What happened'), 'A spike.');
    await within(form).findByRole('option', { name: '3 Marginal' });
    await user.selectOptions(within(form).getByLabelText('Severity'), '3');
    await user.click(within(form).getByRole('button', { name: 'Report anomaly' }));
    expect(await within(form).findByText(message)).toBeInTheDocument();
    expect(within(form).getByLabelText('Instant of the count')).toHaveAttribute('aria-invalid', 'true');
    expect(within(form).getByLabelText('Title')).toHaveValue('Spike');
  });

  it('tells an auditor this page needs another role', async () => {
    server(auditor);
    renderApp('/anomalies/new');
    expect(await screen.findByRole('heading', { level: 1, name: 'You cannot report anomalies' })).toBeInTheDocument();
    expect(screen.queryByRole('form', { name: 'Report an anomaly' })).not.toBeInTheDocument();
  });
});

describe('the anomaly page', () => {
  it('shows the instant as wall time and T with a link to the replay at that instant', async () => {
    server(auditor, detailFakes(anomaly()));
    renderApp('/anomalies/5');
    expect(await screen.findByRole('heading', { level: 1, name: 'Fuel inlet pressure spike' })).toBeInTheDocument();
    const when = screen.getByRole('region', { name: 'When and where' });
    expect(within(when).getByText('T-0:14')).toBeInTheDocument();
    expect(within(when).getByText('2031-05-17', { exact: false })).toHaveAttribute('dateTime', new Date(AT).toISOString());
    expect(within(when).getByRole('link', { name: 'Replay the count at this instant' })).toHaveAttribute('href', `/counts/7/replay?at=${AT}`);
    // An auditor reads; there is nothing to change.
    expect(screen.queryByRole('form', { name: 'Add a corrective action' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Close anomaly' })).not.toBeInTheDocument();
    expect(screen.getByText(/Closing here records the safety officer's decision; it does not make the stand/)).toBeInTheDocument();
  });

  it('adds a corrective action with its owner and due date', async () => {
    const user = userEvent.setup();
    const posts: unknown[] = [];
    let current = anomaly({ actions: [], openActions: 0 });
    server(operator, {
      ...detailFakes(current),
      'GET /api/anomalies/5': () => json(200, current),
      'POST /api/anomalies/5/actions': ({ body }) => {
        posts.push(JSON.parse(String(body)));
        current = anomaly();
        return json(201, current);
      },
    });
    renderApp('/anomalies/5');
    const form = await screen.findByRole('form', { name: 'Add a corrective action' });
    await user.click(within(form).getByRole('button', { name: 'Add corrective action' }));
    expect(within(form).getByText('Choose who owns it.')).toBeInTheDocument();
    expect(posts).toHaveLength(0);
    await user.type(within(form).getByLabelText('What is to be done'), 'Re-zero the inlet transducer');
    await within(form).findByRole('option', { name: 'Mara Oduya' });
    await user.selectOptions(within(form).getByLabelText('Owner', { exact: false }), '3');
    await user.type(within(form).getByLabelText('Due date'), '2031-05-20');
    await user.click(within(form).getByRole('button', { name: 'Add corrective action' }));
    expect(await screen.findByText('Added the corrective action; Mara Oduya is told by e-mail.')).toBeInTheDocument();
    expect(posts).toEqual([{ description: 'Re-zero the inlet transducer', ownerId: 3, dueDate: '2031-05-20' }]);
    expect(within(screen.getByRole('list', { name: 'Corrective actions' })).getByText('Re-zero the inlet transducer')).toBeInTheDocument();
  });

  it('lets a safety officer try to close, and shows the refusal while an action is not done', async () => {
    const user = userEvent.setup();
    const refusal = 'AN-005 cannot be closed while a corrective action is not done: “Re-zero the inlet transducer” (open).';
    server(safety, { ...detailFakes(anomaly()), 'POST /api/anomalies/5/close': json(409, { error: refusal, code: 'actions_not_done' }) });
    renderApp('/anomalies/5');
    const form = await screen.findByRole('form', { name: 'Close the anomaly' });
    expect(screen.getByText(/One corrective action is not done/)).toBeInTheDocument();
    await user.click(within(form).getByRole('button', { name: 'Close anomaly' }));
    expect(await screen.findByText(refusal)).toBeInTheDocument();
  });

  it('does not offer closing to an operator', async () => {
    server(operator, detailFakes(anomaly()));
    renderApp('/anomalies/5');
    await screen.findByRole('heading', { level: 1, name: 'Fuel inlet pressure spike' });
    expect(screen.queryByRole('form', { name: 'Close the anomaly' })).not.toBeInTheDocument();
    expect(screen.getByText('Only a safety officer closes or reopens an anomaly.')).toBeInTheDocument();
  });
});

describe('a new hazard from an anomaly', () => {
  it('opens the hazard form with the anomaly’s values and, on save, adds and links it in one request', async () => {
    const user = userEvent.setup();
    const posts: unknown[] = [];
    const a = anomaly();
    fakeApi({
      'GET /api/auth/me': json(200, safety),
      'GET /api/setup': setup,
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'GET /api/counts': json(200, counts),
      ...detailFakes(a),
      'POST /api/anomalies/5/hazards/new': ({ body }) => {
        posts.push(JSON.parse(String(body)));
        return json(201, kestrelHazards[0]);
      },
    });
    renderApp('/hazards/new?anomaly=5');
    const form = await screen.findByRole('form', { name: 'Add hazard and link it' });
    expect(screen.getByText('From AN-005: Fuel inlet pressure spike')).toBeInTheDocument();
    expect(within(form).getByLabelText('Title')).toHaveValue('Fuel inlet pressure spike');
    expect(within(form).getByLabelText('Description')).toHaveValue(
      'Raised from anomaly AN-005 (Fuel inlet pressure spike).\n\nThe inlet transducer read a spike above its redline.',
    );
    expect(within(form).getByLabelText('Phase')).toHaveValue('firing');
    expect(within(form).getByLabelText('Initial severity')).toHaveValue('2');

    await user.selectOptions(within(form).getByLabelText('System'), 'feed-system');
    await user.selectOptions(within(form).getByLabelText('Initial likelihood'), 'C');
    await user.click(within(form).getByRole('button', { name: 'Add hazard and link it' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Fuel inlet pressure spike' })).toBeInTheDocument();
    expect(posts).toHaveLength(1);
    expect(posts[0]).toMatchObject({
      title: 'Fuel inlet pressure spike',
      system: 'feed-system',
      phase: 'firing',
      causes: ['The inlet transducer read a spike above its redline.'],
      effects: ['Seen in AN-005; immediate actions: Held; line vented.'],
      matrixId: 'mil-std-882e',
      initialSeverity: 2,
      initialLikelihood: 'C',
    });
  });
});

describe('the register and the procedures', () => {
  it('a hazard lists the anomalies linked to it and the procedure revisions they caused', async () => {
    const linked = anomaly({
      hazardIds: [1],
      revisions: [{ procedureId: 1, procedureName: 'Kestrel-2 hot fire', revisionNumber: 3, revisionStatus: 'draft', drafted: true, at: new Date(AT).toISOString() }],
    });
    fakeApi({
      'GET /api/auth/me': json(200, auditor),
      'GET /api/setup': setup,
      'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
      'GET /api/hazards/1': () => json(200, kestrelHazards[0]),
      'GET /api/hazards/1/history': json(200, []),
      'GET /api/anomalies?hazardId=1': json(200, [linked]),
    });
    renderApp('/hazards/1');
    const list = await screen.findByRole('list', { name: 'Anomalies linked to this hazard' });
    expect(within(list).getByRole('link', { name: 'AN-005 Fuel inlet pressure spike' })).toHaveAttribute('href', '/anomalies/5');
    expect(within(list).getByRole('link', { name: 'Kestrel-2 hot fire, revision 3' })).toHaveAttribute('href', '/procedures/1/revisions/3');
    expect(list).toHaveTextContent('drafted because of it');
  });

  it('a procedure revision says which anomaly drafted it, and which were linked to it', () => {
    const rev = (drafted: boolean) => ({ procedureId: 1, procedureName: 'Kestrel-2 hot fire', revisionNumber: 3, revisionStatus: 'draft', drafted, at: new Date(AT).toISOString() });
    const other = { procedureId: 2, procedureName: 'Igniter check', revisionNumber: 3, revisionStatus: 'draft', drafted: true, at: new Date(AT).toISOString() };
    render(
      <MemoryRouter>
        <RevisionAnomalies
          anomalies={[anomaly({ revisions: [rev(true)] }), anomaly({ id: 6, ref: 'AN-006', title: 'Purge line crack', revisions: [rev(false), other] })]}
          procedureId={1}
          revisionNumber={3}
        />
      </MemoryRouter>,
    );
    const items = screen.getAllByRole('listitem');
    expect(items.map((li) => li.textContent)).toEqual([
      'Revision 3 drafted because of anomaly AN-005 Fuel inlet pressure spike',
      'Revision 3 linked to anomaly AN-006 Purge line crack',
    ]);
    expect(within(items[0]!).getByRole('link')).toHaveAttribute('href', '/anomalies/5');
  });
});
