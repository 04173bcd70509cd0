import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SensorDataDto, SensorListDto } from '../../src/contract/sensors';
import { fakeApi, json } from './fake-api';
import { people, renderApp } from './render-app';

afterEach(() => vi.unstubAllGlobals());

// jsdom has no canvas: the page must not try to draw, and the table must carry the readings in words.
const T0 = Date.parse('2026-05-17T14:30:00Z');
const list: SensorListDto = {
  countId: 5,
  countName: 'Kestrel-2 hot fire 3',
  datasets: [
    {
      id: 7,
      countId: 5,
      file: { uploadId: 3, name: 'engine.csv', sizeBytes: 120, sha256: 'a'.repeat(64), url: '/api/uploads/3' },
      timeBase: 'seconds',
      timeColumn: 't_s',
      rows: 5,
      tStart: -1,
      tEnd: 1.5,
      channels: [
        { index: 0, name: 'chamber_pressure', unit: 'bar', low: null, high: 15.5 },
        { index: 1, name: 'thrust', unit: 'kN', low: null, high: null },
      ],
      uploadedBy: { userId: 7, name: 'Noor Fairweather' },
      uploadedAt: '2026-05-17T15:00:00.000Z',
    },
  ],
  timeline: {
    t0At: T0,
    holds: [{ holdId: 'h1', category: 'weather', reason: 'Gusts over the berm', fromT: -180, toT: -90 }],
    redlines: [{ t: -14, instruction: 'LOX tank pressure', station: 'PROP', value: 15, unit: 'bar', message: 'Above the 14 bar limit' }],
    unplacedHolds: 0,
  },
};
const data: SensorDataDto = {
  datasetId: 7,
  rows: 5,
  points: 5,
  decimated: false,
  window: null,
  t: [-1, 0, 0.5, 1, 1.5],
  values: [
    [0, 2, 16, 15, null],
    [0, 0.5, 2.1, 2, 2],
  ],
  summaries: [
    { index: 0, samples: 4, min: 0, tMin: -1, max: 16, tMax: 0.5, excursions: [{ side: 'high', from: 0.5, to: 1, peak: 16, tPeak: 0.5 }], moreExcursions: 0 },
    { index: 1, samples: 5, min: 0, tMin: -1, max: 2.1, tMax: 0.5, excursions: [], moreExcursions: 0 },
  ],
};

function open(me: object = people.operator, routes = {}) {
  return fakeApi({
    'GET /api/auth/me': json(200, me),
    'GET /api/auth/csrf': json(200, { csrfToken: 'tok' }),
    'GET /api/setup': json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' }),
    'GET /api/counts/5/sensors': json(200, list),
    'GET /api/counts/5/sensors/7/data?maxPoints=4000': json(200, data),
    ...routes,
  });
}

describe('the sensor data page', () => {
  it('gives the plot a label and a text table: min, max with its time, limits and each crossing; the timeline in words', async () => {
    open();
    renderApp('/counts/5/data');
    expect(await screen.findByRole('heading', { level: 1, name: 'Sensor data: Kestrel-2 hot fire 3' })).toBeInTheDocument();
    expect(screen.getByText(/These plots are for looking back at a test. They are not a safety authority/)).toBeInTheDocument();
    const table = await screen.findByRole('table', { name: 'Each channel in numbers' });
    const pc = within(table).getByRole('row', { name: /chamber_pressure \(bar\)/ });
    expect(within(pc).getAllByRole('cell').map((c) => c.textContent)).toEqual([
      '0.000 bar at T-1.00 s',
      '16.00 bar at T+0.50 s',
      'at most 15.50 bar',
      'Above 15.50 bar from T+0.50 s to T+1.00 s; furthest 16.00 bar at T+0.50 s',
    ]);
    const thrust = within(table).getByRole('row', { name: /thrust \(kN\)/ });
    expect(within(thrust).getAllByRole('cell')[3]).toHaveTextContent('no limits set');
    expect(screen.getByRole('img', { name: /Plot of chamber_pressure, thrust against seconds from T-0, T-1.00 s to T\+1.50 s/ })).toBeInTheDocument();
    expect(screen.getByText('Hold h1 (weather, Gusts over the berm): T-3:00 to T-1:30')).toBeInTheDocument();
    expect(screen.getByText(/Out-of-limits reading at T-14.00 s: LOX tank pressure \(PROP\) 15 bar/)).toBeInTheDocument();
    expect(screen.getByText(/T-0 was reached at 2026-05-17 14:30:00 UTC/)).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Original file' })).toHaveAttribute('href', '/api/uploads/3');
  });

  it('the channel picker changes what the plot shows; the view buttons do not throw without a canvas', async () => {
    const user = userEvent.setup();
    open();
    renderApp('/counts/5/data');
    await screen.findByRole('table', { name: 'Each channel in numbers' });
    await user.click(screen.getByRole('checkbox', { name: /chamber_pressure/ }));
    expect(screen.getByRole('img', { name: /^Plot of thrust against/ })).toBeInTheDocument();
    for (const name of ['Earlier', 'Later', 'Zoom in', 'Zoom out', 'Reset view']) await user.click(screen.getByRole('button', { name }));
    expect(screen.getByText(/The plot cannot be drawn here/)).toBeInTheDocument();
  });

  it('an operator uploads a CSV as multipart; a refusal shows the server’s words naming the row', async () => {
    const user = userEvent.setup();
    const fetch = open(people.operator, {
      'POST /api/counts/5/sensors': json(400, { error: 'Row 3, column 2 (“p”): “abc” is not a number.', code: 'sensor_not_a_number' }),
    });
    renderApp('/counts/5/data');
    await screen.findByRole('heading', { name: 'Add test data' });
    await user.click(screen.getByRole('button', { name: 'Upload test data' }));
    expect(screen.getByText('Choose a CSV file first.')).toBeInTheDocument();
    await user.upload(screen.getByLabelText('CSV file'), new File(['t_s,p\n0,1\n1,abc\n'], 'bad.csv', { type: 'text/csv' }));
    await user.click(screen.getByRole('button', { name: 'Upload test data' }));
    expect(await screen.findByText('Row 3, column 2 (“p”): “abc” is not a number.')).toBeInTheDocument();
    const post = fetch.mock.calls.find(([, init]) => init?.method === 'POST');
    expect(post![1]!.body).toBeInstanceOf(FormData);
    expect(((post![1]!.body as FormData).get('file') as File).name).toBe('bad.csv');
    expect((post![1]!.body as FormData).get('limits')).toBeNull();
  });

  it('offers limit fields for the channels in the chosen file’s header and sends the filled ones as JSON by name', async () => {
    const user = userEvent.setup();
    const fetch = open(people.operator, {
      'POST /api/counts/5/sensors': json(201, { ...list.datasets[0], id: 8, file: { ...list.datasets[0]!.file, name: 'run.csv' } }),
    });
    renderApp('/counts/5/data');
    await screen.findByRole('heading', { name: 'Add test data' });
    const header = '# recorder 3\nT (s),chamber_pressure (bar),"lox_tank_pressure [bar]"\n0,1,2\n';
    await user.upload(screen.getByLabelText('CSV file'), new File([header], 'run.csv', { type: 'text/csv' }));
    const pc = await screen.findByRole('group', { name: 'Limits for chamber_pressure (optional)' });
    expect(screen.getByRole('group', { name: 'Limits for lox_tank_pressure (optional)' })).toBeInTheDocument();
    expect(screen.queryByRole('group', { name: /Limits for T/ })).not.toBeInTheDocument();
    await user.type(within(pc).getByLabelText('High limit'), '18');
    await user.click(screen.getByRole('button', { name: 'Upload test data' }));
    expect(await screen.findByText('run.csv: 5 rows, 2 channels.')).toBeInTheDocument();
    const post = fetch.mock.calls.find(([, init]) => init?.method === 'POST');
    expect(JSON.parse((post![1]!.body as FormData).get('limits') as string)).toEqual({ chamber_pressure: { high: 18 } });
  });

  it('an auditor reads but is offered no upload, limits or removal', async () => {
    open({ id: 9, email: 'auditor@ternvalley.test', name: 'Hollis Achebe', roles: ['auditor'] });
    renderApp('/counts/5/data');
    await screen.findByRole('table', { name: 'Each channel in numbers' });
    expect(screen.queryByRole('heading', { name: 'Add test data' })).not.toBeInTheDocument();
    expect(screen.queryByText('Edit limits')).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Remove this dataset' })).not.toBeInTheDocument();
  });
});

describe('count times on the sensor page', () => {
  it('read to the hundredth of a second near T-0 and as the count clock a minute or more away', async () => {
    const { formatT } = await import('../../src/features/sensors/components/format');
    expect(formatT(-31.4)).toBe('T-31.40 s');
    expect(formatT(2.5)).toBe('T+2.50 s');
    expect(formatT(0.001)).toBe('T-0');
    expect(formatT(-59.99)).toBe('T-59.99 s');
    expect(formatT(-60)).toBe('T-1:00');
    expect(formatT(-4739)).toBe('T-1:18:59');
    expect(formatT(95.6)).toBe('T+1:36');
  });

  it('print readings near zero in plain decimals down to half a thousandth, smaller ones in e-notation', async () => {
    const { formatValue } = await import('../../src/features/sensors/components/format');
    expect(formatValue(-0.002, 'kN')).toBe('-0.002 kN');
    expect(formatValue(0.004, '')).toBe('0.004');
    expect(formatValue(0.00002, 'bar')).toBe('2.00e-5 bar');
    expect(formatValue(27.3148, 'bar')).toBe('27.31 bar');
    expect(formatValue(0, 'bar')).toBe('0.000 bar');
  });
});
