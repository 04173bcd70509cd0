import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { fakeApi, json } from './fake-api';
import { people, renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });

function serverWithUsers() {
  const users = [
    { ...people.admin, roles: ['admin', 'conductor'], active: true, createdAt: '2025-01-01T10:00:00.000Z' },
    { ...people.operator, roles: ['operator'], active: true, createdAt: '2025-01-02T10:00:00.000Z' },
  ];
  const patches: unknown[] = [];
  const api = fakeApi({
    'GET /api/auth/me': json(200, people.admin),
    'GET /api/setup': setup,
    'GET /api/auth/csrf': json(200, { csrfToken: 't' }),
    'GET /api/invitations': json(200, []),
    'GET /api/users': () => json(200, users),
    'PATCH /api/users/2': ({ body }) => {
      const change = JSON.parse(String(body)) as { roles?: string[]; active?: boolean };
      patches.push(change);
      Object.assign(users[1]!, change);
      return json(200, users[1]);
    },
    'PATCH /api/users/1': json(400, { error: 'That would leave the team without an active administrator.', code: 'last_admin' }),
  });
  return { api, patches };
}

describe('people admin', () => {
  it('saves one row’s roles and confirms it, in canonical order', async () => {
    const user = userEvent.setup();
    const { patches } = serverWithUsers();
    renderApp('/admin/people');
    const row = await screen.findByRole('row', { name: /Rowan Fenn/ });
    await user.click(within(row).getByLabelText('Auditor (read only)'));
    await user.click(within(row).getByLabelText('Safety officer'));
    expect(within(row).getByText('Not saved yet')).toBeInTheDocument();

    await user.click(within(row).getByRole('button', { name: /Save roles/ }));
    expect(await within(row).findByText('Roles saved.')).toBeInTheDocument();
    expect(patches).toEqual([{ roles: ['safety', 'operator', 'auditor'] }]);
    expect(within(row).getByLabelText('Safety officer')).toBeChecked();
    expect(within(row).queryByText('Not saved yet')).not.toBeInTheDocument();
  });

  it('refuses an empty role set without calling the server', async () => {
    const user = userEvent.setup();
    const { patches } = serverWithUsers();
    renderApp('/admin/people');
    const row = await screen.findByRole('row', { name: /Rowan Fenn/ });
    await user.click(within(row).getByLabelText('Station operator'));
    await user.click(within(row).getByRole('button', { name: /Save roles/ }));
    expect(within(row).getByRole('alert')).toHaveTextContent('Choose at least one role');
    expect(patches).toEqual([]);
  });

  it('shows the server’s last_admin refusal in the row', async () => {
    const user = userEvent.setup();
    serverWithUsers();
    renderApp('/admin/people');
    const row = await screen.findByRole('row', { name: /Avery Quill/ });
    await user.click(within(row).getByLabelText('Administrator'));
    expect(within(row).getByText('Without Administrator you lose access to this page.')).toBeInTheDocument();
    await user.click(within(row).getByRole('button', { name: /Save roles/ }));
    expect(await within(row).findByRole('alert')).toHaveTextContent('That would leave the team without an active administrator.');
    // Own row: no way to deactivate yourself.
    expect(within(row).queryByRole('button', { name: /Deactivate/ })).not.toBeInTheDocument();
  });
});
