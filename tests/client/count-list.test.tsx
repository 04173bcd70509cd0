import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { setSocketFactory } from '../../src/lib/socket';
import { countDetail, FakeSocket, startedCount } from './count-fakes';
import { fakeApi, json } from './fake-api';
import { people, renderApp } from './render-app';

afterEach(() => {
  vi.unstubAllGlobals();
  setSocketFactory();
});

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
const summary = (({ state: _s, ...rest }) => rest)(countDetail(startedCount()));
const procedure = {
  id: 7,
  name: 'Kestrel-2 hot fire',
  latestReleased: { number: 2, releasedAt: '2026-03-01T10:00:00.000Z' },
  draft: { number: 3 },
  revisions: [
    { id: 30, number: 1, status: 'released', releasedAt: '2026-02-01T10:00:00.000Z', signoffs: [] },
    { id: 31, number: 2, status: 'released', releasedAt: '2026-03-01T10:00:00.000Z', signoffs: [] },
    { id: 32, number: 3, status: 'draft', releasedAt: null, signoffs: [] },
  ],
};

describe('the count list', () => {
  it('lists counts and lets a conductor create one from the latest released revision, saying why the others cannot be counted', async () => {
    const user = userEvent.setup();
    setSocketFactory(() => new FakeSocket(startedCount()).asSocket());
    const post = vi.fn(() => json(201, countDetail(startedCount())));
    fakeApi({
      'GET /api/auth/me': json(200, people.admin),
      'GET /api/setup': setup,
      'GET /api/counts': json(200, [summary]),
      'GET /api/procedures': json(200, [procedure]),
      'GET /api/procedures/7': json(200, procedure),
      'GET /api/auth/csrf': json(200, { csrfToken: 'csrf-1' }),
      'POST /api/counts': post,
      'GET /api/counts/5': json(200, countDetail(startedCount())),
    });
    const { router } = renderApp('/counts');
    expect(await screen.findByRole('link', { name: 'Kestrel-2 hot fire 3' })).toHaveAttribute('href', '/counts/5');
    expect(screen.getByText(/holdfire is a planning and record aid/i)).toBeInTheDocument();
    expect(screen.getByText(/calls on the radio govern/)).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'New count' }));
    const form = screen.getByRole('form', { name: 'New count' });
    await user.click(within(form).getByRole('button', { name: 'Create count' }));
    expect(within(form).getByText('Choose a procedure')).toBeInTheDocument();
    expect(post).not.toHaveBeenCalled();

    await user.selectOptions(await within(form).findByLabelText('Procedure'), '7');
    expect(await within(form).findByText('Rev. 2: will be counted')).toBeInTheDocument();
    expect(within(form).getByText(/Revision 1 has been replaced by revision 2/)).toBeInTheDocument();
    expect(within(form).getByText(/Revision 3 is a draft/)).toBeInTheDocument();

    await user.type(within(form).getByLabelText('Name'), 'Kestrel-2 hot fire 3');
    await user.click(within(form).getByRole('button', { name: 'Create count' }));
    await vi.waitFor(() => expect(router.state.location.pathname).toBe('/counts/5'));
    const body = JSON.parse(String((post.mock.calls[0] as unknown as [RequestInit])[0].body));
    expect(body).toEqual({ procedureId: 7, revisionId: 31, name: 'Kestrel-2 hot fire 3' });
  });

  it('offers no New count to someone who is not a conductor', async () => {
    fakeApi({ 'GET /api/auth/me': json(200, people.operator), 'GET /api/setup': setup, 'GET /api/counts': json(200, []) });
    renderApp('/counts');
    expect(await screen.findByText('No counts yet.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'New count' })).not.toBeInTheDocument();
  });
});
