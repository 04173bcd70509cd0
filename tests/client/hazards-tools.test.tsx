import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { fakeApi, json } from './fake-api';
import { renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
const operator = { id: 2, email: 'pad@ternvalley.test', name: 'Rowan Fenn', roles: ['operator'] };

describe('engineering checks', () => {
  it('sends the inputs as a query, shows the result with units, sources and cautions', async () => {
    const user = userEvent.setup();
    const urls: string[] = [];
    fakeApi({
      'GET /api/auth/me': json(200, operator),
      'GET /api/setup': setup,
    });
    // Query strings are part of the URL; route on the path only.
    const original = globalThis.fetch;
    globalThis.fetch = (async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = String(input);
      if (url.startsWith('/api/calc/propellant-mass')) {
        urls.push(url);
        return json(200, { massKg: 12.3228, densityKgM3: 1141, source: 'NIST Chemistry WebBook, oxygen', basis: 'F2', cautions: ['Mass uses a density at one reference temperature.'] });
      }
      if (url.startsWith('/api/calc/oxygen')) {
        return json(400, { error: 'percent must be at most 100 (got 140).', code: 'calc_input', details: [{ path: 'percent', message: 'percent must be at most 100 (got 140).' }] });
      }
      return original(input, init);
    }) as typeof fetch;

    renderApp('/hazards/tools');
    expect(await screen.findByRole('heading', { level: 1, name: 'Engineering checks' })).toBeInTheDocument();
    expect(screen.getAllByText(/site's governing code and its licensed authority decide/).length).toBeGreaterThan(0);

    const mass = screen.getByRole('form', { name: 'Propellant mass' });
    await user.click(within(mass).getByRole('button', { name: 'Calculate' }));
    expect(await screen.findByText('12.32 kg')).toBeInTheDocument();
    expect(urls[0]).toBe('/api/calc/propellant-mass?propellant=lox&volumeL=12&fillPercent=90');
    expect(screen.getByText('NIST Chemistry WebBook, oxygen')).toBeInTheDocument();
    expect(screen.getByText('Mass uses a density at one reference temperature.')).toBeInTheDocument();

    const oxygen = screen.getByRole('form', { name: 'Oxygen percentage' });
    const reading = within(oxygen).getByLabelText(/Oxygen reading/);
    await user.clear(reading);
    await user.type(reading, 'lots');
    await user.click(within(oxygen).getByRole('button', { name: 'Calculate' }));
    expect(within(oxygen).getByText('Enter a number, for example 12.5')).toBeInTheDocument();
    await user.clear(reading);
    await user.type(reading, '140');
    await user.click(within(oxygen).getByRole('button', { name: 'Calculate' }));
    expect(await within(oxygen).findByText('percent must be at most 100 (got 140).')).toBeInTheDocument();
    expect(reading).toHaveAttribute('aria-invalid', 'true');
  });
});
