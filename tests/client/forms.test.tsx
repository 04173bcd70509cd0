import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { fakeApi, json } from './fake-api';
import { people, renderApp } from './render-app';

const signedOut = json(401, { error: 'Sign in to continue.', code: 'unauthenticated' });
const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
const csrf = json(200, { csrfToken: 'test-token' });

describe('sign-in form', () => {
  it('ties client-side errors to their fields', async () => {
    const user = userEvent.setup();
    fakeApi({ 'GET /api/auth/me': signedOut, 'GET /api/setup': setup });
    renderApp('/sign-in');
    await user.click(await screen.findByRole('button', { name: 'Sign in' }));

    const email = screen.getByLabelText('E-mail');
    // Validation settles after the click returns (the resolver is async).
    await waitFor(() => expect(email).toHaveAttribute('aria-invalid', 'true'));
    expect(email).toHaveAccessibleDescription(/Enter a valid e-mail address/);
    expect(screen.getByLabelText('Password')).toHaveAccessibleDescription(/Enter your password/);
  });

  it('shows a wrong password as a general alert with the server message', async () => {
    const user = userEvent.setup();
    fakeApi({
      'GET /api/auth/me': signedOut,
      'GET /api/setup': setup,
      'GET /api/auth/csrf': csrf,
      'POST /api/auth/login': json(401, { error: 'E-mail or password is not right.', code: 'bad_credentials' }),
    });
    renderApp('/sign-in');
    await user.type(await screen.findByLabelText('E-mail'), 'pad@ternvalley.test');
    await user.type(screen.getByLabelText('Password'), 'not-the-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Could not sign in');
    expect(alert).toHaveTextContent('E-mail or password is not right.');
  });

  it('goes to the page asked for after signing in', async () => {
    const user = userEvent.setup();
    fakeApi({
      'GET /api/auth/me': signedOut,
      'GET /api/setup': setup,
      'GET /api/auth/csrf': csrf,
      'POST /api/auth/login': json(200, people.operator),
    });
    const { router } = renderApp('/sign-in?next=%2Fprocedures');
    await user.type(await screen.findByLabelText('E-mail'), ' Pad@TernValley.test ');
    await user.type(screen.getByLabelText('Password'), 'kestrel-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));

    expect(await screen.findByRole('heading', { level: 1, name: 'Procedures' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/procedures');
  });

  it('ignores an off-site next address', async () => {
    const user = userEvent.setup();
    fakeApi({
      'GET /api/auth/me': signedOut,
      'GET /api/setup': setup,
      'GET /api/auth/csrf': csrf,
      'POST /api/auth/login': json(200, people.operator),
    });
    const { router } = renderApp('/sign-in?next=%2F%2Fevil.test%2Fphish');
    await user.type(await screen.findByLabelText('E-mail'), 'pad@ternvalley.test');
    await user.type(screen.getByLabelText('Password'), 'kestrel-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Welcome, Rowan Fenn' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/');
  });
});

describe('invite form', () => {
  it('asks for a role, and puts already_exists at the e-mail field', async () => {
    const user = userEvent.setup();
    const api = fakeApi({
      'GET /api/auth/me': json(200, people.admin),
      'GET /api/setup': setup,
      'GET /api/auth/csrf': csrf,
      'GET /api/users': json(200, [{ ...people.admin, roles: [...people.admin.roles], active: true, createdAt: '2025-01-01T10:00:00.000Z' }]),
      'GET /api/invitations': json(200, []),
      'POST /api/invitations': json(409, { error: 'Someone on the team already uses this e-mail address.', code: 'already_exists' }),
    });
    renderApp('/admin/people');
    const form = await screen.findByRole('form', { name: 'Invite someone' });
    const email = (await screen.findAllByLabelText('E-mail')).find((el) => form.contains(el))!;
    await user.type(email, 'admin@ternvalley.test');
    await user.click(screen.getByRole('button', { name: 'Send invitation' }));

    expect(await screen.findByText('Choose at least one role')).toBeInTheDocument();
    expect(api.mock.calls.some(([url, init]) => url === '/api/invitations' && init?.method === 'POST')).toBe(false);

    const roles = screen.getByRole('group', { name: 'Roles' });
    await user.click(within(roles).getByLabelText(/Station operator/));
    await user.click(screen.getByRole('button', { name: 'Send invitation' }));

    expect(await screen.findByText('Someone on the team already uses this e-mail address.')).toBeInTheDocument();
    expect(email).toHaveAttribute('aria-invalid', 'true');
    expect(email).toHaveAccessibleDescription(/already uses this e-mail/);
    const sent = api.mock.calls.find(([url, init]) => url === '/api/invitations' && init?.method === 'POST')!;
    expect(JSON.parse(String(sent[1]!.body))).toEqual({ email: 'admin@ternvalley.test', roles: ['operator'] });
  });
});
