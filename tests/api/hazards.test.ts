import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkAcceptanceMap } from '../../src/domain/hazards/acceptance';
import { validateMatrix } from '../../src/domain/hazards/matrix';
import { checkLevelPalette } from '../../src/domain/hazards/palette';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

let t: TestApp;
let safety: TestClient;
let admin: TestClient;
let operator: TestClient;
let auditor: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  [safety, admin, operator, auditor] = await Promise.all([
    t.client('safety@ternvalley.test'),
    t.client('admin@ternvalley.test'),
    t.client('propellants@ternvalley.test'),
    t.client('auditor@ternvalley.test'),
  ]);
});
afterAll(() => t.stop());

const base = {
  title: 'Test hazard: fuel line chafe',
  system: 'feed-system',
  phase: 'firing',
  causes: ['Line rubs the stand frame'],
  effects: ['Fuel leak'],
  propellants: ['ethanol-water'],
  initialSeverity: 2,
  initialLikelihood: 'C',
};

async function create(body: object = base) {
  const res = await safety.post('/api/hazards', body).expect(201);
  return res.body;
}
const del = (c: TestClient, url: string) => c.agent.delete(url).set('X-CSRF-Token', c.csrf);

describe('hazard register', () => {
  it('lists the seeded Kestrel-2 hazards to every signed-in role, and 401s anonymous', async () => {
    const list = (await auditor.get('/api/hazards').expect(200)).body;
    expect(list.length).toBeGreaterThanOrEqual(15);
    expect(list[0].code).toBe('HZ-001');
    expect(list.some((h: { status: string }) => h.status === 'accepted')).toBe(true);
    expect(list.some((h: { status: string }) => h.status === 'awaiting-acceptance')).toBe(true);
    expect((await operator.get('/api/hazards?status=open&system=test-site').expect(200)).body.every((h: { status: string }) => h.status === 'open')).toBe(true);
    expect((await operator.get('/api/hazards?q=surge').expect(200)).body[0].code).toBe('HZ-001');
    await (await t.client()).get('/api/hazards').expect(401);
  });

  it('creates with a per-team code and MIL-STD-882E Table III risk (2C = Serious)', async () => {
    const h = await create();
    expect(h.code).toMatch(/^HZ-\d{3}$/);
    // MIL-STD-882E Table III: severity 2 Critical, likelihood C Occasional -> Serious.
    expect(h).toMatchObject({ initialSeverity: 2, initialLikelihood: 'C', initialRisk: 'serious', residualRisk: null, status: 'open' });
  });

  it('operator and auditor read but get 403 writing', async () => {
    const h = await create();
    for (const c of [operator, auditor]) {
      await c.get(`/api/hazards/${h.id}`).expect(200);
      await c.post('/api/hazards', base).expect(403);
      await c.patch(`/api/hazards/${h.id}`, { title: 'x' }).expect(403);
      await c.post(`/api/hazards/${h.id}/mitigations`, { kind: 'procedure-ppe', description: 'd', owner: 'o' }).expect(403);
      await c.post(`/api/hazards/${h.id}/status`, { to: 'mitigating' }).expect(403);
      await c.get(`/api/hazards/${h.id}/history`).expect(200);
    }
  });

  it('bad input is a 400 and changes nothing', async () => {
    const before = (await safety.get('/api/hazards').expect(200)).body.length;
    const bad = [
      { ...base, initialSeverity: 7 },
      { ...base, initialLikelihood: 'Z' },
      { title: 'missing fields' },
      { ...base, title: 'x'.repeat(5000) },
      { ...base, extra: true },
      { ...base, system: 'rocket' },
      { ...base, residualSeverity: 2 },
    ];
    for (const body of bad) {
      const res = await safety.post('/api/hazards', body).expect(400);
      expect(res.body.error).toBeTruthy();
      expect(res.body.details.length).toBeGreaterThan(0);
    }
    expect((await safety.get('/api/hazards').expect(200)).body.length).toBe(before);
    await safety.get('/api/hazards/abc').expect(400);
    await safety.get('/api/hazards/99999').expect(404);
  });

  it('records who changed which field, before and after', async () => {
    const h = await create();
    await safety.patch(`/api/hazards/${h.id}`, { title: 'Fuel line chafe at the stand leg', initialLikelihood: 'D' }).expect(200);
    const history = (await auditor.get(`/api/hazards/${h.id}/history`).expect(200)).body;
    const title = history.find((e: { field: string }) => e.field === 'title');
    expect(title).toMatchObject({ userName: 'Priya Halloran', before: base.title, after: 'Fuel line chafe at the stand leg' });
    expect(history.find((e: { field: string }) => e.field === 'initialLikelihood')).toMatchObject({ before: 'C', after: 'D' });
    const bad = await safety.patch(`/api/hazards/${h.id}`, { title: '' }).expect(400);
    expect(bad.body.code).toBe('validation_failed');
    expect((await safety.get(`/api/hazards/${h.id}/history`).expect(200)).body.length).toBe(history.length);
  });

  it('order of precedence: PPE or warnings alone cannot make a hazard Eliminated (MIL-STD-882E 4.3.4)', async () => {
    const h = await create();
    await safety.post(`/api/hazards/${h.id}/mitigations`, { kind: 'procedure-ppe', description: 'Wear gloves', owner: 'Tomasz Reyes' }).expect(201);
    const wd = await safety.post(`/api/hazards/${h.id}/mitigations`, { kind: 'warning-device', description: 'Leak alarm', owner: 'Noor Fairweather' }).expect(201);
    const res = await safety.patch(`/api/hazards/${h.id}`, { residualSeverity: 2, residualLikelihood: 'F' }).expect(400);
    expect(res.body.code).toBe('eliminated_without_design_change');
    expect(res.body.error).toMatch(/cannot make a hazard Eliminated/);
    expect((await safety.get(`/api/hazards/${h.id}`).expect(200)).body.residualLikelihood).toBeNull();

    // An engineered feature can; the mitigations come back most effective first.
    const eng = await safety.post(`/api/hazards/${h.id}/mitigations`, { kind: 'engineered-feature', description: 'Chafe guard', owner: 'Aiko Brennan' }).expect(201);
    expect(eng.body.mitigations[0].kind).toBe('engineered-feature');
    const ok = await safety.patch(`/api/hazards/${h.id}`, { residualSeverity: 2, residualLikelihood: 'F' }).expect(200);
    expect(ok.body.residualRisk).toBe('eliminated');
    // Removing the only engineered feature would leave F unjustified: refused.
    const engId = eng.body.mitigations[0].id;
    await del(safety, `/api/hazards/${h.id}/mitigations/${engId}`).expect(400);
    await safety.patch(`/api/hazards/${h.id}/mitigations/${engId}`, { kind: 'procedure-ppe' }).expect(400);
    await del(safety, `/api/hazards/${h.id}/mitigations/${wd.body.mitigations.find((m: { kind: string }) => m.kind === 'warning-device').id}`).expect(200);
  });

  it('status: awaiting-acceptance needs a residual assessment; illegal moves are refused', async () => {
    const h = await create();
    const res = await safety.post(`/api/hazards/${h.id}/status`, { to: 'awaiting-acceptance' }).expect(400);
    expect(res.body.code).toBe('residual_required');
    await safety.post(`/api/hazards/${h.id}/status`, { to: 'closed' }).expect(409);
    await safety.post(`/api/hazards/${h.id}/status`, { to: 'bogus' }).expect(400);
  });

  it('acceptance of a Serious residual needs safety and admin, two different people', async () => {
    // Residual unchanged at 2C = Serious (MIL-STD-882E Table III); DEFAULT_ACCEPTANCE_MAP: safety + admin.
    const h = await create({ ...base, residualSeverity: 2, residualLikelihood: 'C' });
    await safety.post(`/api/hazards/${h.id}/acceptances`, { as: 'safety' }).expect(409);
    await safety.post(`/api/hazards/${h.id}/status`, { to: 'awaiting-acceptance' }).expect(200);
    await operator.post(`/api/hazards/${h.id}/acceptances`, { as: 'safety' }).expect(403);
    await safety.post(`/api/hazards/${h.id}/acceptances`, { as: 'admin' }).expect(403);
    const one = await safety.post(`/api/hazards/${h.id}/acceptances`, { as: 'safety' }).expect(201);
    expect(one.body.status).toBe('awaiting-acceptance');
    expect(one.body.acceptanceProgress).toEqual({ requiredRoles: ['safety', 'admin'], missingRoles: ['admin'], complete: false });
    await safety.post(`/api/hazards/${h.id}/status`, { to: 'accepted' }).expect(409);
    const two = await admin.post(`/api/hazards/${h.id}/acceptances`, { as: 'admin' }).expect(201);
    expect(two.body.status).toBe('accepted');
    expect(two.body.acceptances.map((a: { userName: string; role: string }) => [a.userName, a.role])).toEqual([
      ['Priya Halloran', 'safety'],
      ['Ines Okafor', 'admin'],
    ]);
    await safety.patch(`/api/hazards/${h.id}`, { residualLikelihood: 'D' }).expect(409);
  });

  it('one person holding two roles cannot sign twice', async () => {
    // Give the admin the safety role too, through the users API.
    const users = (await admin.get('/api/users').expect(200)).body as { id: number; email: string }[];
    const inesId = users.find((u) => u.email === 'admin@ternvalley.test')!.id;
    await admin.patch(`/api/users/${inesId}`, { roles: ['admin', 'safety'] }).expect(200);
    const both = await t.client('admin@ternvalley.test');
    const h = (await both.post('/api/hazards', { ...base, residualSeverity: 2, residualLikelihood: 'C' }).expect(201)).body;
    await both.post(`/api/hazards/${h.id}/status`, { to: 'awaiting-acceptance' }).expect(200);
    await both.post(`/api/hazards/${h.id}/acceptances`, { as: 'safety' }).expect(201);
    const res = await both.post(`/api/hazards/${h.id}/acceptances`, { as: 'admin' }).expect(400);
    expect(res.body.code).toBe('same_person');
    await admin.patch(`/api/users/${inesId}`, { roles: ['admin'] }).expect(200);
  });

  it('freezes calc evidence on a mitigation', async () => {
    const h = await create();
    const m = (await safety.post(`/api/hazards/${h.id}/mitigations`, { kind: 'design-alteration', description: 'Slow valve', owner: 'Tomasz Reyes' }).expect(201)).body.mitigations[0];
    const res = await safety
      .post(`/api/hazards/${h.id}/evidence`, { mitigationId: m.id, calc: 'surge', inputs: { densityKgM3: 998.2, waveSpeedMps: 1482.3, velocityChangeMps: 1 } })
      .expect(201);
    const ev = res.body.mitigations[0].evidence[0];
    // Joukowsky worked example: water, dv 1 m/s -> 1.480 MPa (fluid-transients texts, e.g. Wylie & Streeter).
    expect(ev.kind).toBe('calc');
    expect(ev.data.outputs.deltaPressurePa / 1e6).toBeCloseTo(1.48, 3);
    expect(ev.data.inputs.velocityChangeMps).toBe(1);
    await safety.post(`/api/hazards/${h.id}/evidence`, { mitigationId: m.id, calc: 'oxygen', inputs: { percent: 150 } }).expect(400);
  });
});

describe('risk matrices', () => {
  const matrix = {
    id: 'tvrc-3x3',
    name: 'Invented 3x3 matrix',
    severities: [{ key: 'major', label: 'Major' }, { key: 'minor', label: 'Minor' }],
    likelihoods: [{ key: 'likely', label: 'Likely' }, { key: 'rare', label: 'Rare' }],
    levels: [
      { key: 'red', label: 'Red', rank: 2, colour: '#A3172C' },
      { key: 'green', label: 'Green', rank: 1, colour: '#2B6A4E' },
    ],
    cells: { likely: { major: 'red', minor: 'green' }, rare: { major: 'green', minor: 'green' } },
  };

  it('lists the built-in matrix first and validates team matrices', async () => {
    const list = (await operator.get('/api/risk-matrices').expect(200)).body;
    expect(list[0]).toMatchObject({ id: 'mil-std-882e', builtIn: true, isDefault: true });
    // Every hazard so far is on the built-in matrix: the 15 demo ones and those made above.
    expect(list[0].hazardCount).toBe((await operator.get('/api/hazards').expect(200)).body.length);
    expect(list[0].hazardCount).toBeGreaterThanOrEqual(15);
    // The demo team's drafted site-check matrix: valid, unused, so still editable.
    const demo = list.find((m: { id: string }) => m.id === 'marsh-end-site-checks');
    expect(demo).toMatchObject({ builtIn: false, isDefault: false, retired: false, hazardCount: 0 });
    expect(validateMatrix(demo)).toEqual([]);
    expect(checkLevelPalette(demo.levels)).toEqual([]);
    expect(checkAcceptanceMap(demo.acceptanceMap, demo)).toEqual([]);
    await operator.post('/api/risk-matrices', matrix).expect(403);
    const broken = await safety.post('/api/risk-matrices', { ...matrix, id: 'broken', cells: { likely: { major: 'purple' } } }).expect(400);
    expect(broken.body.details.map((d: { path: string }) => d.path)).toContain('cells.likely.major');
    const made = await safety.post('/api/risk-matrices', matrix).expect(201);
    expect(made.body.acceptanceMap).toEqual({ red: ['safety'], green: ['safety'] });
    await safety.post('/api/risk-matrices', matrix).expect(409);
    const h = await safety.post('/api/hazards', { ...base, matrixId: 'tvrc-3x3', initialSeverity: 'major', initialLikelihood: 'likely' }).expect(201);
    expect(h.body).toMatchObject({ initialSeverity: 'major', initialRisk: 'red' });
    expect((await operator.get('/api/calc/risk?matrix=tvrc-3x3&severity=minor&likelihood=rare').expect(200)).body.level).toBe('green');
  });
});

describe('risk matrix life-cycle', () => {
  const put = (c: TestClient, url: string, body: object) => c.agent.put(url).set('X-CSRF-Token', c.csrf).send(body);
  // An invented 3x3 matrix in the palette's colours (check-values section 2: invented matrices only).
  const matrix = (id: string) => ({
    id,
    name: `Marsh End pad matrix ${id}`,
    severities: [
      { key: 'S1', label: 'Severe', description: 'Injury needing hospital care or loss of the stand' },
      { key: 'S2', label: 'Moderate' },
      { key: 'S3', label: 'Slight' },
    ],
    likelihoods: [{ key: 'L1', label: 'Likely' }, { key: 'L2', label: 'Possible' }, { key: 'L3', label: 'Unlikely' }],
    levels: [
      { key: 'stop', label: 'Stop', rank: 3, colour: '#A3172C', glyph: 'octagon' },
      { key: 'review', label: 'Review', rank: 2, colour: '#7A5C00', glyph: 'diamond' },
      { key: 'proceed', label: 'Proceed', rank: 1, colour: '#2B6A4E', glyph: 'circle' },
    ],
    cells: {
      L1: { S1: 'stop', S2: 'stop', S3: 'review' },
      L2: { S1: 'stop', S2: 'review', S3: 'proceed' },
      L3: { S1: 'review', S2: 'proceed', S3: 'proceed' },
    },
    acceptanceMap: { stop: ['safety', 'admin'], review: ['safety'], proceed: ['safety'] },
  });
  const list = async () => (await operator.get('/api/risk-matrices').expect(200)).body as { id: string; isDefault: boolean }[];

  it('reports every problem at once with the path of its field, and saves nothing', async () => {
    const m = matrix('pad-broken');
    const { L2, ...rows } = m.cells;
    const res = await safety
      .post('/api/risk-matrices', {
        ...m,
        cells: { ...rows, L2: { S1: L2.S1, S2: L2.S2 } },
        levels: [m.levels[0], { ...m.levels[1], colour: '#123456' }, { ...m.levels[2], glyph: 'octagon' }],
        acceptanceMap: { stop: ['safety'], review: ['safety', 'admin'] },
      })
      .expect(400);
    expect(res.body.code).toBe('invalid_matrix');
    const paths = res.body.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['cells.L2.S3', 'levels[1].colour', 'levels[2].glyph', 'acceptanceMap.proceed', 'acceptanceMap.stop']));
    expect(res.body.details.find((d: { path: string }) => d.path === 'cells.L2.S3').message).toBe("No level for likelihood 'L2', severity 'S3'.");
    expect((await list()).map((x) => x.id)).not.toContain('pad-broken');
    // Keys with dots would break cell paths; refused by the contract.
    await safety.post('/api/risk-matrices', { ...matrix('pad-dots'), severities: [{ key: 'a.b', label: 'Dotted' }] }).expect(400);
  });

  it('fills the night colour and keeps the description; edits only while no hazard uses the matrix', async () => {
    const made = (await safety.post('/api/risk-matrices', matrix('pad-edit')).expect(201)).body;
    expect(made).toMatchObject({ builtIn: false, retired: false, isDefault: false, hazardCount: 0 });
    expect(made.levels[0]).toMatchObject({ colour: '#A3172C', nightColour: '#FF7A66' });
    expect(made.severities[0].description).toBe('Injury needing hospital care or loss of the stand');

    const { id: _id, ...definition } = matrix('pad-edit');
    await put(operator, '/api/risk-matrices/pad-edit', { ...definition, name: 'Renamed' }).expect(403);
    const renamed = (await put(admin, '/api/risk-matrices/pad-edit', { ...definition, name: 'Marsh End pad matrix, revised' }).expect(200)).body;
    expect(renamed.name).toBe('Marsh End pad matrix, revised');
    await put(safety, '/api/risk-matrices/mil-std-882e', definition).expect(409);
    await put(safety, '/api/risk-matrices/no-such-matrix', definition).expect(404);

    const h = await create({ ...base, matrixId: 'pad-edit', initialSeverity: 'S1', initialLikelihood: 'L2' });
    expect(h).toMatchObject({ matrixId: 'pad-edit', initialRisk: 'stop' });
    const refused = await put(safety, '/api/risk-matrices/pad-edit', { ...definition, cells: { ...definition.cells, L2: { S1: 'proceed', S2: 'review', S3: 'proceed' } } }).expect(409);
    expect(refused.body).toMatchObject({ code: 'matrix_in_use', error: expect.stringContaining('1 hazard was assessed with this matrix') });
    // The hazard still reads the level it was assessed with.
    expect((await operator.get(`/api/hazards/${h.id}`).expect(200)).body.initialRisk).toBe('stop');
    expect((await list()).find((x) => x.id === 'pad-edit')).toMatchObject({ hazardCount: 1 });
  });

  it('sets the team default for new hazards; retiring keeps old hazards and refuses new ones', async () => {
    await safety.post('/api/risk-matrices', matrix('pad-default')).expect(201);
    expect((await list()).find((x) => x.isDefault)?.id).toBe('mil-std-882e');
    await operator.post('/api/risk-matrices/pad-default/default').expect(403);
    const chosen = (await safety.post('/api/risk-matrices/pad-default/default').expect(200)).body;
    expect(chosen.isDefault).toBe(true);
    expect((await list()).filter((x) => x.isDefault).map((x) => x.id)).toEqual(['pad-default']);

    // No matrixId: the team default applies, so built-in keys no longer fit.
    const bad = await safety.post('/api/hazards', base).expect(400);
    expect(bad.body.code).toBe('invalid_risk');
    const h = await create({ ...base, initialSeverity: 'S2', initialLikelihood: 'L1' });
    expect(h).toMatchObject({ matrixId: 'pad-default', initialRisk: 'stop' });

    const retired = (await safety.post('/api/risk-matrices/pad-default/retire').expect(200)).body;
    expect(retired).toMatchObject({ retired: true, isDefault: false });
    expect((await list()).find((x) => x.isDefault)?.id).toBe('mil-std-882e');
    const refused = await safety.post('/api/hazards', { ...base, matrixId: 'pad-default', initialSeverity: 'S2', initialLikelihood: 'L1' }).expect(400);
    expect(refused.body).toMatchObject({ code: 'matrix_retired', details: [{ path: 'matrixId' }] });
    await safety.post('/api/risk-matrices/pad-default/default').expect(409);
    // The hazard on it keeps its matrix and can still be re-assessed within it.
    const patched = (await safety.patch(`/api/hazards/${h.id}`, { initialLikelihood: 'L3' }).expect(200)).body;
    expect(patched).toMatchObject({ matrixId: 'pad-default', initialRisk: 'proceed' }); // L3 x S2 in the invented map
    // Nothing moves onto a retired matrix.
    const other = await create();
    await safety.patch(`/api/hazards/${other.id}`, { matrixId: 'pad-default', initialSeverity: 'S1', initialLikelihood: 'L1' }).expect(400);

    await safety.post('/api/risk-matrices/pad-default/reinstate').expect(200);
    await safety.post('/api/risk-matrices/mil-std-882e/default').expect(200);
    expect((await list()).find((x) => x.isDefault)?.id).toBe('mil-std-882e');
    await safety.post('/api/risk-matrices/mil-std-882e/retire').expect(409);
  });
});

describe('propellants', () => {
  it('shows properties with unit and source, and lets only safety edit cautions, with history', async () => {
    const lox = (await auditor.get('/api/propellants/lox').expect(200)).body;
    // NIST Chemistry WebBook, oxygen, saturation properties: 1141 kg/m3 at the normal boiling point.
    expect(lox.properties.find((p: { key: string }) => p.key === 'densityNbp')).toMatchObject({ value: 1141, unit: 'kg/m3' });
    for (const c of lox.cautions) expect(c.source.trim()).not.toBe('');
    for (const item of lox.ppe) expect(item).toEqual({ text: expect.any(String), source: expect.any(String) });
    await auditor.get('/api/propellants/unobtainium').expect(400);
    const mine = { key: 'marsh-end-ground', severity: 'warning', text: 'Never fill LOX over the tarmac apron at Marsh End.', source: 'Tern Valley site rules, section 4' };
    const body = { cautions: [mine, ...lox.cautions] };
    await admin.patch('/api/propellants/lox/cautions', body).expect(403);
    await safety.patch('/api/propellants/lox/cautions', { ...body, extra: 1 }).expect(400);
    const noSource = await safety.patch('/api/propellants/lox/cautions', { cautions: [{ ...mine, source: '  ' }] }).expect(400);
    expect(noSource.body.details).toEqual([{ path: 'cautions.0.source', message: 'Enter where this comes from' }]);
    const twice = await safety.patch('/api/propellants/lox/cautions', { cautions: [mine, mine] }).expect(400);
    expect(twice.body.details[0].path).toBe('cautions.1.key');
    await safety.patch('/api/propellants/lox/cautions', { cautions: [mine], ppe: [{ text: 'Face shield' }] }).expect(400);
    expect((await operator.get('/api/propellants/lox/history').expect(200)).body).toHaveLength(0);

    const edited = (await safety.patch('/api/propellants/lox/cautions', body).expect(200)).body;
    expect(edited).toMatchObject({ cautionsEdited: true, cautionsEditedBy: 'Priya Halloran' });
    expect(edited.cautions[0]).toEqual(mine);
    // Saving the same again leaves no second history line.
    await safety.patch('/api/propellants/lox/cautions', body).expect(200);
    const ppe = [{ text: 'Face shield over safety glasses', source: 'Tern Valley site rules, section 2' }];
    const withPpe = (await safety.patch('/api/propellants/lox/cautions', { ...body, ppe }).expect(200)).body;
    expect(withPpe.ppe).toEqual(ppe);
    const history = (await operator.get('/api/propellants/lox/history').expect(200)).body;
    expect(history).toHaveLength(2);
    expect(history[0].before.cautions).toHaveLength(lox.cautions.length);
    expect(history[0].after.cautions).toHaveLength(lox.cautions.length + 1);
    expect(history[1].before.ppe).toEqual(lox.ppe);
    expect(history[1].after.ppe).toEqual(ppe);
  });
});
