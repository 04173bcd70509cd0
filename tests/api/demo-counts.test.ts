/**
 * The demo counts are written by the seed through the same domain functions as a live count. The times below are
 * worked by hand from the seed's story (server/db/seed-counts.ts) and the demo procedure's plan: it starts at
 * T-2:00:00 with built-in holds of 10 min (T-30:00) and 5 min (T-5:00).
 */
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { STATION_GRACE_MS } from '../../server/counts/service';
import { DEMO, signInWithCookie } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { connected, openSocket } from '../helpers/counts';

let t: TestApp;
let auditor: TestClient;
let counts: { id: number; name: string; status: string }[];

beforeAll(async () => {
  t = await startTestApp();
  auditor = await t.client(DEMO.auditor);
  counts = (await auditor.get('/api/counts').expect(200)).body;
});
afterAll(() => t.stop());

function idOf(name: string): number {
  const c = counts.find((x) => x.name === name);
  if (!c) throw new Error(`no demo count ${name}`);
  return c.id;
}
const report = async (name: string) => (await auditor.get(`/api/counts/${idOf(name)}/report`).expect(200)).body;

describe('the demo counts', () => {
  it('are three finished counts whose logs verify', async () => {
    expect(counts.map((c) => [c.name, c.status]).sort()).toEqual([
      ['Kestrel-2 static fire 1', 'scrubbed'],
      ['Kestrel-2 static fire 2', 'complete'],
      ['Kestrel-2 static fire 3', 'complete'],
    ]);
    for (const c of counts) {
      const verdict = (await auditor.get(`/api/counts/${c.id}/verify`).expect(200)).body;
      expect(verdict, c.name).toMatchObject({ ok: true });
      expect(verdict.count).toBeGreaterThan(40);
    }
  });

  it('static fire 1 was scrubbed for the wind after its reading crossed the redline', async () => {
    const r = await report('Kestrel-2 static fire 1');
    expect(r.actualT0At).toBeNull();
    expect(r.redlines.map((x: { stepKey: string; value: number }) => [x.stepKey, x.value])).toEqual([
      ['wind', 12.5],
      ['wind', 11.8],
      ['wind', 12.9],
    ]);
    const state = (await auditor.get(`/api/counts/${idOf('Kestrel-2 static fire 1')}/state`).expect(200)).body;
    expect(state.scrub).toMatchObject({ category: 'weather', by: { name: 'Priya Halloran' } });
    expect(state.status).toBe('scrubbed');
  });

  it('static fire 2 fired after two holds and a recycle from the terminal count', async () => {
    const r = await report('Kestrel-2 static fire 2');
    // Started 06:45:00Z at T-2:00:00: 120 min of count and 15 min of built-in holds puts T-0 at 09:00:00Z.
    expect(r.plannedT0At).toBe(Date.parse('2025-05-31T09:00:00Z'));
    expect(r.actualT0At).toBeGreaterThan(r.plannedT0At);
    expect(r.holds.count).toBeGreaterThanOrEqual(2);
    expect(r.holds.list.map((h: { calledByStation: string; calledAtT: number }) => [h.calledByStation, h.calledAtT])).toEqual([
      ['RANGE', -1420],
      ['DATA', -430],
      ['PAD', -41],
    ]);
    expect(r.recycles).toEqual([expect.objectContaining({ fromT: -41, toT: -600 })]);
    expect(r.polls.passed).toBeGreaterThan(0);
  });

  it('static fire 3 held on a fuel-pressure redline, cleared it and fired', async () => {
    const r = await report('Kestrel-2 static fire 3');
    expect(r.redlines).toEqual([expect.objectContaining({ stepKey: 'fuel-pressure', value: 36.4, unit: 'bar', t: -810 })]);
    expect(r.holds.list).toEqual([expect.objectContaining({ source: 'redline', calledAtT: -810, clearedAt: expect.any(Number) })]);
    expect(r.actualT0At).not.toBeNull();
  });

  it('static fire 3’s redline became the demo anomaly, linked to the surge hazard', async () => {
    const anomalies = (await auditor.get(`/api/anomalies?countId=${idOf('Kestrel-2 static fire 3')}`).expect(200)).body as { countId: number; hazardIds: number[]; tText: string }[];
    expect(anomalies).toHaveLength(1);
    const hazards = (await auditor.get('/api/hazards?q=surge').expect(200)).body as { id: number; code: string }[];
    const surge = hazards.find((h) => h.code === 'HZ-001')!;
    expect(anomalies[0]!.hazardIds).toContain(surge.id);
    // The redline reading was at T-13:30 (-810 s); the anomaly is reported at that instant.
    expect(anomalies[0]!.tText).toContain('13:30');
  });

  it('static fire 2 carries its recorded sensor data: chamber pressure, thrust and both tank pressures', async () => {
    const list = (await auditor.get(`/api/counts/${idOf('Kestrel-2 static fire 2')}/sensors`).expect(200)).body as {
      datasets: { rows: number; channels: { name: string }[] }[];
      timeline: { t0At: number | null };
    };
    expect(list.datasets).toHaveLength(2);
    const names = list.datasets.flatMap((d) => d.channels.map((c) => c.name.toLowerCase())).join(' ');
    for (const word of ['chamber', 'thrust', 'lox', 'fuel']) expect(names).toContain(word);
    expect(list.timeline.t0At).toBe((await report('Kestrel-2 static fire 2')).actualT0At);
  });

  it('a finished count’s log stays as it closed: no presence is logged once read back, nor when its crew opens it', async () => {
    const id = idOf('Kestrel-2 static fire 2');
    const before = (await auditor.get(`/api/counts/${id}/verify`).expect(200)).body;
    // The log shows the stations connected when it closed; reading it back arms nothing, and a crew member's phone
    // joining the finished count adds nothing.
    await new Promise<void>((resolve) => t.holdfire.httpServer.listen(0, '127.0.0.1', resolve));
    const url = `http://127.0.0.1:${(t.holdfire.httpServer.address() as AddressInfo).port}`;
    const { cookie } = await signInWithCookie(t, DEMO.propellants);
    const phone = openSocket(url, cookie);
    try {
      await connected(phone);
      await phone.timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: 0 });
      await new Promise((resolve) => setTimeout(resolve, STATION_GRACE_MS + 500));
    } finally {
      phone.disconnect();
    }
    await new Promise((resolve) => setTimeout(resolve, STATION_GRACE_MS + 500));
    const after = (await auditor.get(`/api/counts/${id}/verify`).expect(200)).body;
    expect(after).toEqual(before);
  });

  it('a restart leaves the finished demo counts alone', async () => {
    await t.holdfire.counts.recover();
    const again = (await auditor.get('/api/counts').expect(200)).body as { name: string; status: string }[];
    expect(again.map((c) => c.status).sort()).toEqual(['complete', 'complete', 'scrubbed']);
  });
});
