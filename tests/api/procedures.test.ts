import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseTMinus } from '../../src/domain/procedures/tminus';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { createProcedure, del, put, sampleContent } from '../helpers/procedures';

let t: TestApp;
let conductor: TestClient;
let safety: TestClient;
let admin: TestClient;
let operator: TestClient;
let auditor: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  [conductor, safety, admin, operator, auditor] = await Promise.all([
    t.client(DEMO.conductor),
    t.client(DEMO.safety),
    t.client(DEMO.admin),
    t.client(DEMO.propellants),
    t.client(DEMO.auditor),
  ]);
});
afterAll(() => t.stop());

interface StepBody {
  key: string;
  kind: string;
  tSeconds: number | null;
  t: string | null;
  station: string;
  instruction: string;
  hazardIds: number[];
  cautions: { level: string; text: string; sources: { type: string; hazardCode?: string }[] }[];
  [k: string]: unknown;
}
const stepsOf = (rev: { phases: { steps: StepBody[] }[] }) => rev.phases.flatMap((p) => p.steps);

describe('the demo Kestrel-2 static-fire procedure', () => {
  it('is listed for every signed-in role, with one released revision and one draft', async () => {
    for (const c of [operator, auditor]) {
      const list = (await c.get('/api/procedures').expect(200)).body;
      const k2 = list.find((p: { name: string }) => p.name === 'Kestrel-2 static fire');
      expect(k2).toMatchObject({ site: 'Marsh End test site', latestReleased: { number: 1 }, draft: { number: 2 } });
      const detail = (await c.get(`/api/procedures/${k2.id}`).expect(200)).body;
      expect(detail.revisions.map((r: { number: number; status: string }) => [r.number, r.status])).toEqual([
        [1, 'released'],
        [2, 'draft'],
      ]);
      expect(detail.revisions[0].signoffs.map((s: { userName: string; role: string }) => [s.role, s.userName])).toEqual([
        ['conductor', 'Marek Lindqvist'],
        ['safety', 'Priya Halloran'],
      ]);
      expect(detail.revisions[0]).toHaveProperty('id');
    }
    await (await t.client()).get('/api/procedures').expect(401);
  });

  it('runs from T-2:00:00 to T+0:10:00 in about 60 steps, in phases, never going back in time', async () => {
    const rev = (await operator.get('/api/procedures/1/revisions/1').expect(200)).body;
    expect(rev.status).toBe('released');
    expect(rev.phases.map((p: { name: string }) => p.name)).toEqual([
      'Pad set-up',
      'Leak checks',
      'Propellant loading',
      'Terminal count',
      'Firing',
      'Safing and detanking',
    ]);
    const steps = stepsOf(rev);
    expect(steps.length).toBeGreaterThanOrEqual(55);
    expect(steps.length).toBeLessThanOrEqual(70);
    const timed = steps.filter((s) => s.tSeconds !== null).map((s) => s.tSeconds as number);
    expect(timed[0]).toBe(parseTMinus('T-2:00:00'));
    expect(timed.at(-1)).toBe(parseTMinus('T+0:10:00'));
    for (let i = 1; i < timed.length; i++) expect(timed[i]).toBeGreaterThanOrEqual(timed[i - 1]!);
    expect(steps[0]!.t).toBe('T-2:00:00');
  });

  it('has built-in holds at T-30:00 and T-5:00, a poll at every phase boundary, redlined readings and personnel checks', async () => {
    const rev = (await operator.get('/api/procedures/1/revisions/1').expect(200)).body;
    const steps = stepsOf(rev);
    expect(steps.filter((s) => s.kind === 'builtInHold').map((s) => [s.t, s.durationSeconds])).toEqual([
      ['T-30:00', 600],
      ['T-5:00', 300],
    ]);
    // Every phase ends with a go/no-go poll naming its stations.
    for (const p of rev.phases as { steps: StepBody[] }[]) {
      const last = p.steps.at(-1)!.kind === 'poll' ? p.steps.at(-1)! : p.steps.at(-2)!;
      expect(last.kind).toBe('poll');
      expect((last.stations as string[]).length).toBeGreaterThan(0);
    }
    const readings = steps.filter((s) => s.kind === 'reading');
    const unitOf = (re: RegExp) => readings.find((s) => re.test(s.instruction));
    expect(unitOf(/^LOX run-tank pressure\./)).toMatchObject({ unit: 'bar', min: 28, max: 32 });
    expect(unitOf(/^Fuel run-tank pressure\./)).toMatchObject({ unit: 'bar', min: 31, max: 35 });
    expect(unitOf(/LOX run-tank level/)).toMatchObject({ unit: '%', min: 85, max: 95 });
    expect(unitOf(/Igniter continuity/)).toMatchObject({ unit: 'ohm', min: 0.8, max: 3 });
    expect(unitOf(/bottle gauge/)).toMatchObject({ unit: 'bar', min: 200 });
    // Personnel checks before loading and before arming.
    const idx = (key: string) => steps.findIndex((s) => s.key === key);
    const checks = steps.map((s, i) => [s, i] as const).filter(([s]) => s.kind === 'personnelCheck');
    expect(checks.some(([s, i]) => i < idx('fuel-load') && (s.checks as string[]).includes('keep-out-clear'))).toBe(true);
    expect(checks.some(([s, i]) => i < idx('arm') && i > idx('hold-5') && (s.checks as string[]).includes('head-count'))).toBe(true);
  });

  it('resolves each step\'s cautions from linked hazards and propellants, warnings first', async () => {
    const rev = (await operator.get('/api/procedures/1/revisions/1').expect(200)).body;
    const steps = stepsOf(rev);
    const fill = steps.find((s) => s.key === 'lox-fill')!;
    const levels = fill.cautions.map((c) => c.level);
    expect(levels[0]).toBe('warning');
    expect(levels.indexOf('note')).toBeGreaterThan(levels.lastIndexOf('warning'));
    // HZ-003's splash rule is on the fill step; the library's oxygen-soaked clothing warning too.
    expect(fill.cautions.some((c) => c.text.includes('airs clothing for at least 15 minutes') && c.sources[0]!.hazardCode === 'HZ-003')).toBe(true);
    expect(fill.cautions.some((c) => c.level === 'warning' && /soaked with oxygen/.test(c.text))).toBe(true);
    expect(fill.cautions.some((c) => c.level === 'caution' && /brittle/.test(c.text))).toBe(true);
    // The igniter steps carry the radio rule from HZ-007; most steps carry at least one caution.
    const connect = steps.find((s) => s.key === 'igniter-connect')!;
    expect(connect.cautions.some((c) => /No radios within 5 m/.test(c.text))).toBe(true);
    expect(steps.filter((s) => s.cautions.length > 0).length).toBeGreaterThan(steps.length / 2);
  });

  it('revision 2 is a draft that cannot be counted; revision 1 can', async () => {
    const one = (await operator.get('/api/procedures/1/revisions/1').expect(200)).body;
    const two = (await operator.get('/api/procedures/1/revisions/2').expect(200)).body;
    expect(one).toMatchObject({ countable: true, notCountableReason: null, cautionsChangedSinceRelease: false });
    expect(two).toMatchObject({ status: 'draft', countable: false, basedOn: 1 });
    expect(two.notCountableReason).toMatch(/draft/);
  });

  it('diff between the demo revisions names the added, removed, changed and moved steps', async () => {
    const d = (await auditor.get('/api/procedures/1/diff?from=1&to=2').expect(200)).body;
    expect(d.from).toBe(1);
    expect(d.to).toBe(2);
    expect(d.added.map((x: { key: string }) => x.key)).toEqual(['cameras']);
    expect(d.removed.map((x: { key: string }) => x.key)).toEqual(['data-fast']);
    expect(Object.fromEntries(d.changed.map((x: { key: string; fields: string[] }) => [x.key, x.fields]))).toEqual({
      'fire-setup': ['tSeconds'],
      wind: ['max'],
      'lox-fill': ['instruction'],
    });
    expect(d.changed.find((x: { key: string }) => x.key === 'wind')).toMatchObject({ before: { max: 10 }, after: { max: 8 } });
    expect(d.moved.map((x: { key: string }) => x.key)).toEqual(['fire-setup']);
    await auditor.get('/api/procedures/1/diff?from=1&to=9').expect(404);
    await auditor.get('/api/procedures/1/diff?from=1').expect(400);
  });
});

describe('writing procedures', () => {
  it('conductor, safety and admin create; operator and auditor get 403 and nothing is made', async () => {
    for (const c of [conductor, safety, admin]) {
      const p = await createProcedure(c, 'Cold-flow water test');
      const detail = (await c.get(`/api/procedures/${p.id}`).expect(200)).body;
      expect(detail.revisions).toEqual([{ id: expect.any(Number), number: 1, status: 'draft', releasedAt: null, signoffs: [] }]);
      expect((await c.get(`/api/procedures/${p.id}/revisions/1`).expect(200)).body.phases).toEqual([]);
    }
    const before = (await auditor.get('/api/procedures').expect(200)).body.length;
    for (const c of [operator, auditor]) {
      await c.post('/api/procedures', { name: 'Sneaky' }).expect(403);
      await c.patch('/api/procedures/1', { name: 'Renamed' }).expect(403);
      await put(c, '/api/procedures/1/revisions/2', sampleContent()).expect(403);
      await c.post('/api/procedures/1/revisions').expect(403);
    }
    expect((await auditor.get('/api/procedures').expect(200)).body.length).toBe(before);
  });

  it('saves a draft\'s phases and steps, giving new steps stable keys', async () => {
    const p = await createProcedure(conductor);
    const saved = (await put(conductor, `/api/procedures/${p.id}/revisions/1`, sampleContent()).expect(200)).body;
    expect(saved.signoffsCleared).toBe(false);
    const steps = stepsOf(saved);
    expect(steps).toHaveLength(6);
    expect(new Set(steps.map((s) => s.key)).size).toBe(6);
    expect(saved.phases[0].key).toMatch(/^p-/);
    // Saving again with the keys it gave keeps them.
    const again = structuredClone(saved);
    for (const ph of again.phases) for (const st of ph.steps) { delete st.t; delete st.cautions; }
    again.phases[1].steps[1].instruction = 'Fill the LOX run tank at low flow; stop at liquid at the vent.';
    const resaved = (await put(conductor, `/api/procedures/${p.id}/revisions/1`, { phases: again.phases.map((ph: object) => ph) }).expect(200)).body;
    expect(stepsOf(resaved).map((s) => s.key)).toEqual(steps.map((s) => s.key));
    expect(stepsOf(resaved)[4]!.instruction).toMatch(/stop at liquid/);
    const read = (await operator.get(`/api/procedures/${p.id}/revisions/1`).expect(200)).body;
    expect(stepsOf(read)[4]!.instruction).toMatch(/stop at liquid/);
  });

  it('refuses broken rules with 400 and a path at each field, all at once, and saves nothing', async () => {
    const p = await createProcedure(conductor);
    await put(conductor, `/api/procedures/${p.id}/revisions/1`, sampleContent()).expect(200);
    const bad = sampleContent();
    bad.phases[0]!.steps[1] = { kind: 'reading', tSeconds: null, station: 'PAD', instruction: 'Bottle pressure.', unit: '', min: 300, max: 200 } as never;
    bad.phases[0]!.steps[2] = { kind: 'poll', tSeconds: -4000, station: 'TC', instruction: 'Go?', stations: [] } as never;
    bad.phases[1]!.steps[2] = { kind: 'builtInHold', tSeconds: -1800, station: 'TC', instruction: 'Hold.' } as never;
    bad.phases[1]!.steps[0] = { kind: 'reading', tSeconds: -2900, station: 'SAFE', instruction: 'No limits.', unit: 'bar' } as never;
    const res = await put(conductor, `/api/procedures/${p.id}/revisions/1`, bad).expect(400);
    expect(res.body.code).toBe('validation_failed');
    const paths = res.body.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(
      expect.arrayContaining([
        'phases.0.steps.1.unit',
        'phases.0.steps.1.max',
        'phases.0.steps.2.stations',
        'phases.0.steps.2.tSeconds',
        'phases.1.steps.2.durationSeconds',
        'phases.1.steps.0.min',
      ]),
    );
    const decrease = res.body.details.find((d: { path: string }) => d.path === 'phases.0.steps.2.tSeconds');
    expect(decrease.message).toMatch(/times never go back down the list/);
    // Nothing changed: the stored draft still has the good reading.
    const rev = (await conductor.get(`/api/procedures/${p.id}/revisions/1`).expect(200)).body;
    expect(stepsOf(rev)[1]).toMatchObject({ unit: 'bar', min: 200, max: 300 });
  });

  it('refuses unknown stations and hazards at their paths', async () => {
    const p = await createProcedure(conductor);
    const bad = sampleContent(999_999);
    bad.phases[0]!.steps[0]!.station = 'NOPE';
    (bad.phases[0]!.steps[2] as { stations: string[] }).stations = ['PAD', 'XYZ'];
    const res = await put(conductor, `/api/procedures/${p.id}/revisions/1`, bad).expect(400);
    expect(res.body.details.map((d: { path: string }) => d.path)).toEqual([
      'phases.0.steps.0.station',
      'phases.0.steps.2.stations.1',
      'phases.1.steps.1.hazardIds.0',
    ]);
    expect((await conductor.get(`/api/procedures/${p.id}/revisions/1`).expect(200)).body.phases).toEqual([]);
  });

  it('refuses malformed bodies with 400, never 500', async () => {
    const p = await createProcedure(conductor);
    const url = `/api/procedures/${p.id}/revisions/1`;
    for (const body of [{}, { phases: 'x' }, { phases: [{ name: 'A', steps: [{ kind: 'teleport' }] }] }, { phases: [], extra: 1 }, { phases: [{ name: 'A', steps: [{ kind: 'action', tSeconds: 1.5, station: 'TC', instruction: 'x' }] }] }]) {
      const res = await put(conductor, url, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.details.length).toBeGreaterThan(0);
    }
    await put(conductor, '/api/procedures/99999/revisions/1', sampleContent()).expect(404);
    await put(conductor, `/api/procedures/${p.id}/revisions/7`, sampleContent()).expect(404);
    await conductor.get('/api/procedures/abc').expect(400);
  });

  it('patches metadata; unknown listed stations are refused', async () => {
    const p = await createProcedure(conductor);
    const res = await conductor.patch(`/api/procedures/${p.id}`, { name: 'Kestrel-2 cold flow', stations: ['FIRE'] }).expect(200);
    expect(res.body).toMatchObject({ name: 'Kestrel-2 cold flow', stations: ['FIRE'] });
    const bad = await conductor.patch(`/api/procedures/${p.id}`, { stations: ['FIRE', 'NOPE'] }).expect(400);
    expect(bad.body.details).toEqual([{ path: 'stations.1', message: 'There is no station with the short code NOPE.' }]);
    await conductor.patch(`/api/procedures/${p.id}`, {}).expect(400);
    expect((await conductor.get(`/api/procedures/${p.id}`).expect(200)).body.stations).toEqual(['FIRE']);
  });

  it('opens one draft at a time, as a copy of the latest revision; a second draft is 409', async () => {
    const res = await conductor.post('/api/procedures/1/revisions').expect(409);
    expect(res.body.code).toBe('draft_open');
    const p = await createProcedure(conductor);
    await conductor.post(`/api/procedures/${p.id}/revisions`).expect(409);
  });

  it('a draft can be discarded, but not a released revision or the only revision', async () => {
    const p = await createProcedure(conductor);
    await del(conductor, `/api/procedures/${p.id}/revisions/1`).expect(409);
    await del(operator, '/api/procedures/1/revisions/2').expect(403);
    await del(conductor, '/api/procedures/1/revisions/1').expect(409);
    // Imported as a draft, copied, then the copy is discarded: the procedure is back to one revision.
    const exported = (await operator.get('/api/procedures/1/revisions/1/export').expect(200)).body;
    const imported = (await conductor.post('/api/procedures/import', exported).expect(201)).body;
    await put(conductor, `/api/procedures/${imported.id}/revisions/1`, sampleContent()).expect(200);
    await conductor.post(`/api/procedures/${imported.id}/revisions/1/signoffs`, { as: 'conductor' }).expect(201);
    await safety.post(`/api/procedures/${imported.id}/revisions/1/signoffs`, { as: 'safety' }).expect(201);
    await conductor.post(`/api/procedures/${imported.id}/revisions`).expect(201);
    const after = (await del(conductor, `/api/procedures/${imported.id}/revisions/2`).expect(200)).body;
    expect(after.revisions.map((r: { number: number }) => r.number)).toEqual([1]);
    await conductor.get(`/api/procedures/${imported.id}/revisions/2`).expect(404);
  });
});
