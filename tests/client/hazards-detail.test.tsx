import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { fakeApi, json } from './fake-api';
import { kestrelHazards } from './hazards-fixtures';
import { renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
const safety = { id: 3, email: 'safety@ternvalley.test', name: 'Mara Oduya', roles: ['safety'] };
const auditor = { id: 5, email: 'audit@ternvalley.test', name: 'Theo Brandt', roles: ['auditor'] };
const operator = { id: 2, email: 'pad@ternvalley.test', name: 'Rowan Fenn', roles: ['operator'] };

const history = [
  { id: 1, userId: 3, userName: 'Mara Oduya', field: 'created', before: null, after: { code: 'HZ-001' }, at: '2026-03-01T09:00:00.000Z' },
  { id: 2, userId: 3, userName: 'Mara Oduya', field: 'residualLikelihood', before: 'D', after: 'E', at: '2026-03-02T09:00:00.000Z' },
];

function server(me: object, extra: Parameters<typeof fakeApi>[0] = {}) {
  return fakeApi({
    'GET /api/auth/me': json(200, me),
    'GET /api/setup': setup,
    'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
    'GET /api/hazards/1': () => json(200, kestrelHazards[0]),
    'GET /api/hazards/1/history': json(200, history),
    ...extra,
  });
}

describe('hazard detail', () => {
  it.each([
    ['auditor', auditor],
    ['operator', operator],
  ])('shows an %s every field and the history, but no edit controls', async (_name, me) => {
    server(me);
    renderApp('/hazards/1');
    expect(await screen.findByRole('heading', { level: 1, name: 'HZ-001 LOX run tank overpressure on Kestrel-2' })).toBeInTheDocument();
    expect(screen.getByText('Vent valve stuck shut')).toBeInTheDocument();
    expect(screen.getByText('Burst disc rated 1.1 × MEOP')).toBeInTheDocument();
    const historyTable = await screen.findByRole('table', { name: /Every change to this hazard/ });
    expect(within(historyTable).getByText('Residual likelihood')).toBeInTheDocument();
    for (const name of [/Edit hazard/, /Add a mitigation/, /^Edit$/, /Remove/, /Accept as/, /Return to mitigating/, /Close/, /Reopen/]) {
      expect(screen.queryByRole('button', { name })).not.toBeInTheDocument();
    }
    expect(screen.getByText(/Recording an acceptance here does not make a risk acceptable/)).toBeInTheDocument();
  });

  it('lists mitigations in order of precedence and shows what acceptance is missing', async () => {
    server(safety);
    renderApp('/hazards/1');
    const mitigations = await screen.findByRole('region', { name: 'Mitigations' });
    const items = within(mitigations).getAllByRole('listitem');
    expect(items[0]).toHaveTextContent('3. Incorporate engineered features or devices');
    expect(items[1]).toHaveTextContent('5. Signage, procedures, training and PPE');
    const status = screen.getByRole('region', { name: 'Status and acceptance' });
    expect(within(status).getByText('Still missing:')).toBeInTheDocument();
    expect(within(status).getByRole('button', { name: 'Accept as Safety officer' })).toBeInTheDocument();
    expect(within(status).queryByRole('button', { name: /Accept as Administrator/ })).not.toBeInTheDocument();
    expect(within(status).getByRole('button', { name: 'Return to mitigating' })).toBeInTheDocument();
  });

  it('shows the risk level live while editing and the server’s refusal at the residual likelihood', async () => {
    const user = userEvent.setup();
    const message = 'Warnings, signage, procedures, training and PPE cannot make a hazard Eliminated (F); only a design change or engineered feature can.';
    const patches: unknown[] = [];
    server(safety, {
      'PATCH /api/hazards/1': ({ body }) => {
        patches.push(JSON.parse(String(body)));
        return json(400, { error: message, code: 'eliminated_without_design_change', details: [{ path: 'residualLikelihood', message }] });
      },
    });
    renderApp('/hazards/1');
    await user.click(await screen.findByRole('button', { name: 'Edit hazard' }));
    const form = screen.getByRole('form', { name: 'Save changes' });
    expect(within(form).getByText('Residual risk level:').parentElement).toHaveTextContent('Medium');

    await user.selectOptions(within(form).getByLabelText('Residual likelihood'), 'F');
    expect(within(form).getByText('Residual risk level:').parentElement).toHaveTextContent('Eliminated');
    await user.selectOptions(within(form).getByLabelText('Initial likelihood'), 'A');
    expect(within(form).getByText('Initial risk level:').parentElement).toHaveTextContent('High');

    await user.click(within(form).getByRole('button', { name: 'Save changes' }));
    const field = within(form).getByLabelText('Residual likelihood');
    expect(await within(form).findByText(message)).toBeInTheDocument();
    expect(field).toHaveAttribute('aria-invalid', 'true');
    expect(field.getAttribute('aria-describedby')).toContain(within(form).getByText(message).closest('p')!.id);
    expect(patches).toHaveLength(1);
    expect(patches[0]).toMatchObject({ initialSeverity: 1, initialLikelihood: 'A', residualSeverity: 1, residualLikelihood: 'F' });
  });

  it('refuses the new-hazard page to an auditor', async () => {
    server(auditor);
    renderApp('/hazards/new');
    expect(await screen.findByRole('heading', { level: 1, name: 'You cannot add hazards' })).toBeInTheDocument();
    expect(screen.queryByRole('form')).not.toBeInTheDocument();
  });
});
