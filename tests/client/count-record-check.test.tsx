import { createHash } from 'node:crypto';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { RecordCheck } from '../../src/features/counts/components/RecordCheck';
import { eventHash, GENESIS_HASH, type ChainedEvent } from '../../src/domain/count/chain';
import { fakeApi, json } from './fake-api';

// Node's own SHA-256 builds the chain; the component recomputes it with the browser's Web Crypto.
const nodeSha256 = async (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

async function chain(n: number): Promise<ChainedEvent[]> {
  const out: ChainedEvent[] = [];
  let prev = GENESIS_HASH;
  for (let seq = 1; seq <= n; seq++) {
    const content = { countId: 9, seq, type: seq === 1 ? 'count:created' : 'reading:recorded', at: 1_900_000_000_000 + seq * 1000, actor: { userId: 3, name: 'Noor Fairweather' }, station: 'DATA', payload: { value: 20 + seq, unit: 'bar' } };
    const hash = await eventHash(prev, content, nodeSha256);
    out.push({ ...content, prevHash: prev, hash });
    prev = hash;
  }
  return out;
}

afterEach(() => vi.unstubAllGlobals());

describe('the record check', () => {
  it('recomputes the chain in the browser with Web Crypto and shows the server’s verdict and the last hash', async () => {
    expect(globalThis.crypto?.subtle).toBeDefined();
    const events = await chain(5);
    fakeApi({ 'GET /api/counts/9/events': json(200, events), 'GET /api/counts/9/verify': json(200, { ok: true, count: 5, lastHash: events[4]!.hash }) });
    render(<MemoryRouter><RecordCheck countId={9} /></MemoryRouter>);
    await userEvent.click(screen.getByRole('button', { name: 'Check the record' }));
    const status = await screen.findByRole('status');
    expect(within(status).getByText('Checked in this browser: intact: 5 events, each chained to the one before.')).toBeInTheDocument();
    expect(within(status).getByText('Checked on the server: intact: 5 events, each chained to the one before.')).toBeInTheDocument();
    expect(within(status).getByText(events[4]!.hash)).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Download the log (CSV)' })).toHaveAttribute('href', '/api/counts/9/export?format=csv');
  });

  it('names the first changed event, even when the server was fooled', async () => {
    const events = await chain(5);
    events[2] = { ...events[2]!, payload: { value: 99, unit: 'bar' } };
    fakeApi({ 'GET /api/counts/9/events': json(200, events), 'GET /api/counts/9/verify': json(200, { ok: true, count: 5, lastHash: events[4]!.hash }) });
    render(<MemoryRouter><RecordCheck countId={9} /></MemoryRouter>);
    await userEvent.click(screen.getByRole('button', { name: 'Check the record' }));
    const status = await screen.findByRole('status');
    expect(within(status).getByText('Checked in this browser: BROKEN at event #3: this event’s content was changed after it was written.')).toBeInTheDocument();
  });
});
