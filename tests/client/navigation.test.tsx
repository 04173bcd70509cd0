import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { fakeApi, json } from './fake-api';
import { people, renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });

describe('navigation by role', () => {
  it('shows People and Mail outbox only to admins', async () => {
    fakeApi({ 'GET /api/auth/me': json(200, people.operator), 'GET /api/setup': setup });
    renderApp('/');
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    for (const name of ['Home', 'Hazards', 'Procedures', 'Live count', 'Records', 'Profile']) {
      expect(within(nav).getByRole('link', { name })).toBeInTheDocument();
    }
    expect(within(nav).queryByRole('link', { name: 'People' })).not.toBeInTheDocument();
    expect(within(nav).queryByRole('link', { name: 'Mail outbox' })).not.toBeInTheDocument();
  });

  it('gives admins the admin links', async () => {
    fakeApi({ 'GET /api/auth/me': json(200, people.admin), 'GET /api/setup': setup });
    renderApp('/');
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(within(nav).getByRole('link', { name: 'People' })).toHaveAttribute('href', '/admin/people');
    expect(within(nav).getByRole('link', { name: 'Mail outbox' })).toHaveAttribute('href', '/admin/mail');
    expect(await screen.findByRole('heading', { level: 1, name: 'Welcome, Avery Quill' })).toBeInTheDocument();
    expect(await screen.findByText('Tern Valley Rocketry Collective')).toBeInTheDocument();
  });

  it('shows "You do not have access" at an admin address instead of redirecting', async () => {
    fakeApi({ 'GET /api/auth/me': json(200, people.operator), 'GET /api/setup': setup });
    const { router } = renderApp('/admin/people');
    expect(await screen.findByRole('heading', { level: 1, name: 'You do not have access' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/admin/people');
  });

  it('sends a signed-out visitor to sign in, remembering the page', async () => {
    fakeApi({ 'GET /api/auth/me': json(401, { error: 'Sign in to continue.', code: 'unauthenticated' }), 'GET /api/setup': setup });
    const { router } = renderApp('/records?from=log');
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(new URLSearchParams(router.state.location.search).get('next')).toBe('/records?from=log');
  });

  it('answers an unknown address with a 404 page', async () => {
    fakeApi({ 'GET /api/auth/me': json(200, people.operator), 'GET /api/setup': setup });
    renderApp('/no/such/page');
    expect(await screen.findByRole('heading', { level: 1, name: 'Page not found' })).toBeInTheDocument();
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeInTheDocument();
  });

  it('marks a placeholder area as not built, with no fake content', async () => {
    fakeApi({ 'GET /api/auth/me': json(200, people.operator), 'GET /api/setup': setup });
    renderApp('/records');
    expect(await screen.findByRole('heading', { level: 1, name: 'Replay and reports' })).toBeInTheDocument();
    expect(screen.getAllByText('Not built yet').length).toBeGreaterThan(0);
    expect(screen.getByRole('link', { name: 'Records' })).toHaveAttribute('aria-current', 'page');
  });
});
