import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

// The exchange format, version 1 (docs/procedures.md): export, import, and every problem reported at once.
let t: TestApp;
let conductor: TestClient;
let operator: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  [conductor, operator] = await Promise.all([t.client(DEMO.conductor), t.client(DEMO.propellants)]);
});
afterAll(() => t.stop());

type Doc = {
  format: string;
  version: number;
  procedure: Record<string, unknown>;
  revision: Record<string, unknown>;
  stations: { code: string }[];
  phases: { key: string; name: string; steps: Record<string, unknown>[] }[];
};
const exportOf = async (rev = 1): Promise<Doc> => (await operator.get(`/api/procedures/1/revisions/${rev}/export`).expect(200)).body;
const strip = (phases: { steps: { cautions?: unknown }[] }[]) => phases.map((p) => ({ ...p, steps: p.steps.map(({ cautions: _c, ...s }) => s) }));
const count = async () => (await operator.get('/api/procedures').expect(200)).body.length as number;

describe('export', () => {
  it('writes the documented format: count times as T-minus text, hazards by code, stations used', async () => {
    const res = await operator.get('/api/procedures/1/revisions/1/export').expect(200);
    expect(res.headers['content-disposition']).toBe('attachment; filename="kestrel-2-static-fire-rev-1.holdfire.json"');
    const doc = res.body as Doc;
    expect(doc).toMatchObject({ format: 'holdfire.procedure', version: 1, procedure: { name: 'Kestrel-2 static fire', site: 'Marsh End test site' } });
    expect(doc.revision).toMatchObject({ number: 1, status: 'released' });
    const first = doc.phases[0]!.steps[0]!;
    expect(first).toMatchObject({ key: 'brief', t: 'T-2:00:00', station: 'TC', hazards: ['HZ-003', 'HZ-007'] });
    expect(first).not.toHaveProperty('tSeconds');
    expect(first).not.toHaveProperty('hazardIds');
    expect(first).not.toHaveProperty('cautions');
    expect(doc.stations.map((s) => s.code).sort()).toEqual(['DATA', 'FIRE', 'PAD', 'PROP', 'RANGE', 'SAFE', 'TC']);
  });
});

describe('import', () => {
  it('round-trips: export then import gives a new procedure with a draft of the same steps', async () => {
    const doc = await exportOf(1);
    const before = await count();
    const created = (await conductor.post('/api/procedures/import', doc).expect(201)).body;
    expect(await count()).toBe(before + 1);
    expect(created).toMatchObject({ name: 'Kestrel-2 static fire', testArticle: doc.procedure.testArticle, stations: ['FIRE'], draft: { number: 1 }, latestReleased: null });
    expect(created.revisions).toEqual([{ id: expect.any(Number), number: 1, status: 'draft', releasedAt: null, signoffs: [] }]);
    const original = (await operator.get('/api/procedures/1/revisions/1').expect(200)).body;
    const copy = (await operator.get(`/api/procedures/${created.id}/revisions/1`).expect(200)).body;
    expect(strip(copy.phases)).toEqual(strip(original.phases));
    // Re-exported, it is the same document apart from the revision record and the time.
    const again = (await operator.get(`/api/procedures/${created.id}/revisions/1/export`).expect(200)).body;
    expect(again.phases).toEqual(doc.phases);
    expect(again.procedure).toEqual(doc.procedure);
  });

  it('a file without keys gets new keys on import', async () => {
    const doc = await exportOf(2);
    for (const p of doc.phases) {
      delete (p as { key?: string }).key;
      for (const s of p.steps) delete s.key;
    }
    const created = (await conductor.post('/api/procedures/import', doc).expect(201)).body;
    const rev = (await operator.get(`/api/procedures/${created.id}/revisions/1`).expect(200)).body;
    const keys = rev.phases.flatMap((p: { steps: { key: string }[] }) => p.steps.map((s) => s.key));
    expect(keys.every((k: string) => /^s-/.test(k))).toBe(true);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('reports every problem at once, each at its path, and imports nothing', async () => {
    const doc = await exportOf(1);
    const before = await count();
    const steps = doc.phases[0]!.steps;
    steps[0]!.t = 'two hours before';
    steps[2] = { ...steps[2], max: null }; // the wind reading loses its only limit
    steps[3]!.station = 'GATE';
    steps[4]!.hazards = ['HZ-003', 'HZ-404'];
    steps[6]!.kind = 'countdown';
    doc.phases[1]!.steps[1]!.unit = '';
    doc.phases[1]!.steps[5]!.t = 'T-2:00:00'; // earlier than the steps before it
    doc.phases[3]!.steps[0]!.durationSeconds = 0; // the T-30:00 hold
    (doc.procedure as { name: string }).name = '';
    const res = await conductor.post('/api/procedures/import', doc).expect(400);
    expect(res.body.code).toBe('import_invalid');
    expect(res.body.error).toMatch(/^The file has \d+ problems; nothing was imported\.$/);
    // Listed from the top of the file down.
    const paths = res.body.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(
      [
        'procedure.name',
        'phases.0.steps.0.t',
        'phases.0.steps.2.min',
        'phases.0.steps.3.station',
        'phases.0.steps.4.hazards.1',
        'phases.0.steps.6.kind',
        'phases.1.steps.1.unit',
        'phases.1.steps.5.t',
        'phases.3.steps.0.durationSeconds',
      ],
    );
    const byPath = Object.fromEntries(res.body.details.map((d: { path: string; message: string }) => [d.path, d.message]));
    expect(byPath['phases.0.steps.0.t']).toMatch(/not a count time/);
    expect(byPath['phases.0.steps.4.hazards.1']).toBe('There is no hazard HZ-404 in your register.');
    expect(byPath['phases.1.steps.5.t']).toMatch(/times never go back down the list/);
    expect(await count()).toBe(before);
  });

  it('refuses another format or version, and a body that is not an object', async () => {
    const doc = await exportOf(1);
    const wrong = await conductor.post('/api/procedures/import', { ...doc, format: 'something-else', version: 2 }).expect(400);
    expect(wrong.body.details.map((d: { path: string }) => d.path).sort()).toEqual(['format', 'version']);
    const extra = await conductor.post('/api/procedures/import', { ...doc, surprise: true }).expect(400);
    expect(extra.body.details[0].path).toBe('(file)');
    await conductor.post('/api/procedures/import', [doc]).expect(400);
    const empty = await conductor.post('/api/procedures/import', {}).expect(400);
    expect(empty.body.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['format', 'version', 'procedure', 'phases']));
    const bad = await conductor.agent.post('/api/procedures/import').set('X-CSRF-Token', conductor.csrf).set('Content-Type', 'application/json').send('{"format":');
    expect(bad.status).toBe(400);
    expect(bad.body.code).toBe('bad_json');
  });

  it('operators cannot import', async () => {
    const before = await count();
    await operator.post('/api/procedures/import', await exportOf(1)).expect(403);
    expect(await count()).toBe(before);
  });
});
