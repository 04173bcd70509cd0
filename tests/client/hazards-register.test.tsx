import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { csvField, toCsv } from '../../src/features/hazards/lib/csv';
import { hazardsToCsv } from '../../src/features/hazards/lib/exportCsv';
import { fakeApi, json } from './fake-api';
import { hazard, kestrelHazards } from './hazards-fixtures';
import { renderApp } from './render-app';

const setup = json(200, { needsFirstAdmin: false, teamName: 'Tern Valley Rocketry Collective' });
const safety = { id: 3, email: 'safety@ternvalley.test', name: 'Mara Oduya', roles: ['safety'] };
const auditor = { id: 5, email: 'audit@ternvalley.test', name: 'Theo Brandt', roles: ['auditor'] };

function server(me: object) {
  return fakeApi({ 'GET /api/auth/me': json(200, me), 'GET /api/setup': setup, 'GET /api/hazards': () => json(200, kestrelHazards) });
}

function tableRows() {
  const table = screen.getByRole('table', { name: /Hazards \(\d+ shown\)/ });
  // First row is the header row.
  return within(table).getAllByRole('row').slice(1);
}

describe('hazard register', () => {
  it('folds the select filters behind one button on phones and counts the ones set', async () => {
    const user = userEvent.setup();
    server(safety);
    renderApp('/hazards?status=open&system=engine');
    const toggle = await screen.findByRole('button', { name: 'Show filters (2 set)' });
    expect(toggle).toHaveAttribute('aria-expanded', 'false');
    const panel = document.getElementById(toggle.getAttribute('aria-controls')!)!;
    // Hidden below md only: the md:grid class shows it on wider screens.
    expect(panel).toHaveClass('hidden', 'md:grid');
    expect(within(panel).getByLabelText('Status')).toHaveValue('open');
    await user.click(toggle);
    expect(screen.getByRole('button', { name: 'Hide filters (2 set)' })).toHaveAttribute('aria-expanded', 'true');
    expect(panel).not.toHaveClass('hidden');
  });

  it('counts hazards per matrix cell and switches to residual counts', async () => {
    const user = userEvent.setup();
    server(safety);
    renderApp('/hazards');
    // Initial: HZ-002 and HZ-003 are both 2/C, HZ-001 is 1/C.
    expect(await screen.findByRole('button', { name: 'Occasional (C) by Critical (2): Serious, 2 hazards' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Occasional (C) by Catastrophic (1): High, 1 hazard' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Remote (D) by Marginal (3): Medium, 1 hazard' })).toBeInTheDocument();

    await user.click(screen.getByLabelText('Residual risk (after mitigation)'));
    expect(screen.getByRole('button', { name: 'Occasional (C) by Critical (2): Serious, 0 hazards' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Improbable (E) by Catastrophic (1): Medium, 1 hazard' })).toBeInTheDocument();
    expect(screen.getByText(/3 hazards have no residual assessment yet/)).toBeInTheDocument();
  });

  it('filters the table by the clicked cell, shows the filter and clears it', async () => {
    const user = userEvent.setup();
    server(safety);
    renderApp('/hazards');
    const cell = await screen.findByRole('button', { name: /Occasional \(C\) by Critical \(2\)/ });
    expect(tableRows()).toHaveLength(4);

    await user.click(cell);
    expect(cell).toHaveAttribute('aria-pressed', 'true');
    const rows = tableRows();
    expect(rows).toHaveLength(2);
    expect(rows.map((r) => within(r).getByRole('rowheader').textContent)).toEqual(
      expect.arrayContaining(['Ethanol spill at the fuel fill point', 'Igniter fires early during "safing"']),
    );
    const chip = screen.getByRole('button', { name: /Remove filter Matrix cell: Initial C Occasional × 2 Critical/ });
    expect(screen.getByText('2 of 4 hazards')).toBeInTheDocument();

    await user.click(chip);
    expect(tableRows()).toHaveLength(4);
    expect(cell).toHaveAttribute('aria-pressed', 'false');
    expect(screen.queryByRole('button', { name: /Remove filter/ })).not.toBeInTheDocument();
  });

  it('combines text search and select filters', async () => {
    const user = userEvent.setup();
    server(safety);
    renderApp('/hazards');
    await screen.findByRole('table', { name: /Hazards/ });
    await user.type(screen.getByLabelText('Search'), 'marsh end');
    expect(tableRows()).toHaveLength(1);
    expect(within(tableRows()[0]!).getByRole('rowheader')).toHaveTextContent('LOX run tank overpressure');
    await user.clear(screen.getByLabelText('Search'));
    await user.selectOptions(screen.getByLabelText('Status'), 'closed');
    expect(tableRows()).toHaveLength(1);
    expect(within(tableRows()[0]!).getByRole('rowheader')).toHaveTextContent('GN2 bottle falls over');
  });

  it('shows "New hazard" to a safety officer but not to an auditor', async () => {
    server(safety);
    const first = renderApp('/hazards');
    expect(await screen.findByRole('link', { name: 'New hazard' })).toHaveAttribute('href', '/hazards/new');
    first.unmount();
    server(auditor);
    renderApp('/hazards');
    await screen.findByRole('table', { name: /Hazards/ });
    expect(screen.queryByRole('link', { name: 'New hazard' })).not.toBeInTheDocument();
  });
});

describe('CSV export', () => {
  it('quotes every field, doubles quotes, keeps commas and newlines inside the field', () => {
    expect(csvField('plain')).toBe('"plain"');
    expect(csvField('say "hold"')).toBe('"say ""hold"""');
    expect(csvField('a, b\nc')).toBe('"a, b\nc"');
    expect(csvField(null)).toBe('""');
    expect(csvField(['one', 'two'])).toBe('"one; two"');
    expect(toCsv(['A', 'B'], [[1, 'x,y']])).toBe('"A","B"\r\n"1","x,y"\r\n');
  });

  it('defuses spreadsheet formulas', () => {
    expect(csvField('=HYPERLINK("x")')).toBe('"\'=HYPERLINK(""x"")"');
    expect(csvField('-5')).toBe('"\'-5"');
    expect(csvField('+1')).toBe('"\'+1"');
  });

  it('exports a hazard with quotes and line breaks as one record', () => {
    const csv = hazardsToCsv([hazard({ id: 9, title: 'Valve "V-3" sticks, then slams', description: 'Line one\nLine two', causes: ['Ice', 'Grit'] })]);
    const [header, record, end] = csv.split('\r\n');
    expect(header!.startsWith('"Code","Title","System"')).toBe(true);
    expect(record).toContain('"HZ-009","Valve ""V-3"" sticks, then slams","Feed system"');
    expect(record).toContain('"Line one\nLine two"');
    expect(record).toContain('"Ice; Grit"');
    expect(end).toBe('');
  });
});
