import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { countableRevision, isRevisionCountable, revisionCountability } from '../../server/procedures/countable';
import { HttpError } from '../../server/http/errors';
import { Team } from '../../server/models';
import { createUser, DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { createProcedure, put, sampleContent } from '../helpers/procedures';

// The two-person rule (issue #4): release needs a test conductor and a safety officer who are different people;
// the second sign-off releases and the revision is frozen from then on; only released revisions are counted.
let t: TestApp;
let conductor: TestClient;
let safety: TestClient;
let admin: TestClient;
let operator: TestClient;
let both: TestClient;
let teamId: number;
let hazardId: number;
beforeAll(async () => {
  t = await startTestApp();
  [conductor, safety, admin, operator] = await Promise.all([t.client(DEMO.conductor), t.client(DEMO.safety), t.client(DEMO.admin), t.client(DEMO.propellants)]);
  const u = await createUser({ name: 'Sam Both', roles: ['conductor', 'safety'] });
  both = await t.client(u.email, u.password);
  teamId = (await Team.findOne({ order: [['id', 'ASC']] }))!.id;
  const hazards = (await safety.get('/api/hazards').expect(200)).body as { id: number; code: string }[];
  hazardId = hazards.find((h) => h.code === 'HZ-003')!.id;
});
afterAll(() => t.stop());

const sign = (c: TestClient, id: number, rev: number, as: string) => c.post(`/api/procedures/${id}/revisions/${rev}/signoffs`, { as });

async function draftWithSteps(): Promise<number> {
  const p = await createProcedure(conductor, 'Release test');
  await put(conductor, `/api/procedures/${p.id}/revisions/1`, sampleContent(hazardId)).expect(200);
  return p.id;
}

describe('sign-offs', () => {
  it('conductor then safety officer release the draft; it becomes countable', async () => {
    const id = await draftWithSteps();
    expect(await isRevisionCountable(teamId, id, 1)).toBe(false);
    const first = (await sign(conductor, id, 1, 'conductor').expect(201)).body;
    expect(first).toMatchObject({ status: 'draft', countable: false });
    expect(first.signoffs).toEqual([{ role: 'conductor', userId: expect.any(Number), userName: 'Marek Lindqvist', at: expect.any(String) }]);
    const second = (await sign(safety, id, 1, 'safety').expect(201)).body;
    expect(second).toMatchObject({ status: 'released', countable: true, notCountableReason: null });
    expect(second.releasedAt).toEqual(expect.any(String));
    expect(await isRevisionCountable(teamId, id, 1)).toBe(true);
    const detail = (await operator.get(`/api/procedures/${id}`).expect(200)).body;
    expect(detail.latestReleased.number).toBe(1);
    expect(detail.draft).toBeNull();
  });

  it('the same person cannot sign for both roles', async () => {
    const id = await draftWithSteps();
    await sign(both, id, 1, 'conductor').expect(201);
    const res = await sign(both, id, 1, 'safety').expect(400);
    expect(res.body).toMatchObject({ code: 'same_person', details: [{ path: 'as', message: expect.any(String) }] });
    const again = await sign(both, id, 1, 'conductor').expect(409);
    expect(again.body.code).toBe('already_signed');
    // Another conductor cannot take the role that is already signed either.
    expect((await sign(conductor, id, 1, 'conductor').expect(409)).body.code).toBe('role_already_signed');
    const rev = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body;
    expect(rev.status).toBe('draft');
    expect(rev.signoffs).toHaveLength(1);
    // A different safety officer completes it.
    expect((await sign(safety, id, 1, 'safety').expect(201)).body.status).toBe('released');
  });

  it('signing as a role you do not hold is 403; operators and admins cannot sign at all', async () => {
    const id = await draftWithSteps();
    expect((await sign(conductor, id, 1, 'safety').expect(403)).body.code).toBe('forbidden');
    expect((await sign(safety, id, 1, 'conductor').expect(403)).body.code).toBe('forbidden');
    await sign(admin, id, 1, 'conductor').expect(403);
    await sign(operator, id, 1, 'safety').expect(403);
    await sign(conductor, id, 1, 'auditor').expect(400);
    expect((await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body.signoffs).toEqual([]);
  });

  it('an empty draft cannot be signed', async () => {
    const p = await createProcedure(conductor, 'Empty');
    expect((await sign(conductor, p.id, 1, 'conductor').expect(409)).body.code).toBe('revision_empty');
  });

  it('changing the draft after a first sign-off clears it; saving the same content does not', async () => {
    const id = await draftWithSteps();
    await sign(conductor, id, 1, 'conductor').expect(201);
    const current = (await conductor.get(`/api/procedures/${id}/revisions/1`).expect(200)).body;
    const same = { phases: current.phases.map((ph: { key: string; name: string; steps: Record<string, unknown>[] }) => ({ ...ph, steps: ph.steps.map(({ t: _t, cautions: _c, ...s }) => s) })) };
    const unchanged = (await put(conductor, `/api/procedures/${id}/revisions/1`, same).expect(200)).body;
    expect(unchanged.signoffsCleared).toBe(false);
    expect(unchanged.signoffs).toHaveLength(1);
    same.phases[0].steps[1].max = 310;
    const changed = (await put(safety, `/api/procedures/${id}/revisions/1`, same).expect(200)).body;
    expect(changed.signoffsCleared).toBe(true);
    expect(changed.signoffs).toEqual([]);
    // Safety alone cannot release now: the conductor must sign the changed draft again.
    expect((await sign(safety, id, 1, 'safety').expect(201)).body.status).toBe('draft');
    expect((await sign(conductor, id, 1, 'conductor').expect(201)).body.status).toBe('released');
  });
});

describe('a released revision is frozen', () => {
  it('PUT after release is 409 and changes nothing; signing again is 409', async () => {
    const id = await draftWithSteps();
    await sign(conductor, id, 1, 'conductor').expect(201);
    await sign(safety, id, 1, 'safety').expect(201);
    const before = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body;
    const res = await put(conductor, `/api/procedures/${id}/revisions/1`, sampleContent()).expect(409);
    expect(res.body.code).toBe('revision_released');
    expect((await sign(both, id, 1, 'safety').expect(409)).body.code).toBe('revision_released');
    const after = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body;
    expect(after.phases).toEqual(before.phases);
    expect(after.signoffs).toEqual(before.signoffs);
  });

  it('a new revision is a draft copy of the released one, and only the latest released revision counts', async () => {
    const id = await draftWithSteps();
    await sign(conductor, id, 1, 'conductor').expect(201);
    await sign(safety, id, 1, 'safety').expect(201);
    const draft = (await conductor.post(`/api/procedures/${id}/revisions`).expect(201)).body;
    const one = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body;
    expect(draft).toMatchObject({ number: 2, status: 'draft', basedOn: 1, signoffs: [], countable: false });
    const strip = (r: { phases: { steps: { cautions: unknown }[] }[] }) => r.phases.map((p) => ({ ...p, steps: p.steps.map(({ cautions: _c, ...s }) => s) }));
    expect(strip(draft)).toEqual(strip(one));
    await conductor.post(`/api/procedures/${id}/revisions`).expect(409);

    // The draft is not countable; the helper for the live count says why.
    const c = await revisionCountability(teamId, id, 2);
    expect(c).toMatchObject({ countable: false, reason: 'draft' });
    await expect(countableRevision(teamId, id, 2)).rejects.toMatchObject({ status: 409, code: 'not_countable' });
    await expect(countableRevision(teamId, id, 3)).rejects.toBeInstanceOf(HttpError);
    expect((await countableRevision(teamId, id, 1)).number).toBe(1);

    // Release revision 2: revision 1 is superseded and no longer counted.
    await sign(conductor, id, 2, 'conductor').expect(201);
    await sign(safety, id, 2, 'safety').expect(201);
    expect(await isRevisionCountable(teamId, id, 2)).toBe(true);
    expect(await revisionCountability(teamId, id, 1)).toMatchObject({ countable: false, reason: 'superseded' });
    expect((await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body.countable).toBe(false);
  });

  it('keeps the cautions it was signed with, and says when the register has changed since', async () => {
    const id = await draftWithSteps();
    await sign(conductor, id, 1, 'conductor').expect(201);
    await sign(safety, id, 1, 'safety').expect(201);
    const before = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body;
    const fillBefore = before.phases[1].steps[1];
    expect(before.cautionsChangedSinceRelease).toBe(false);
    // The safety officer adds a mitigation to HZ-003 after the release.
    await safety
      .post(`/api/hazards/${hazardId}/mitigations`, { kind: 'procedure-ppe', description: 'Two-person rule at the LOX fill point.', owner: 'Priya Halloran' })
      .expect(201);
    const after = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body;
    expect(after.cautionsChangedSinceRelease).toBe(true);
    expect(after.phases[1].steps[1].cautions).toEqual(fillBefore.cautions);
    // A new draft shows the register as it is now.
    const draft = (await conductor.post(`/api/procedures/${id}/revisions`).expect(201)).body;
    expect(draft.phases[1].steps[1].cautions.some((c: { text: string }) => c.text === 'Two-person rule at the LOX fill point.')).toBe(true);
  });
});

describe('diff between any two revisions', () => {
  it('reports a changed, a moved, an added and a removed step by key', async () => {
    const id = await draftWithSteps();
    await sign(conductor, id, 1, 'conductor').expect(201);
    await sign(safety, id, 1, 'safety').expect(201);
    const draft = (await conductor.post(`/api/procedures/${id}/revisions`).expect(201)).body;
    const phases = draft.phases.map((ph: { key: string; name: string; steps: Record<string, unknown>[] }) => ({
      ...ph,
      steps: ph.steps.map(({ t: _t, cautions: _c, ...s }) => s),
    }));
    const [leak, load] = phases;
    const removed = leak.steps.splice(1, 1)[0]; // bottle reading
    const moved = load.steps.shift(); // personnel check goes to the end of leak checks
    moved.tSeconds = -2900;
    leak.steps.push(moved);
    load.steps[0].instruction = 'Fill the LOX run tank at low flow, standing upwind.';
    load.steps.push({ kind: 'verification', tSeconds: null, station: 'SAFE', instruction: 'Clothing check after the fill.' });
    await put(conductor, `/api/procedures/${id}/revisions/2`, { phases }).expect(200);
    const d = (await operator.get(`/api/procedures/${id}/diff?from=1&to=2`).expect(200)).body;
    expect(d.removed.map((x: { key: string }) => x.key)).toEqual([removed.key]);
    expect(d.moved).toMatchObject([{ key: moved.key, from: { phaseName: 'Loading', index: 0 }, to: { phaseName: 'Leak checks', index: 2 } }]);
    expect(d.changed).toMatchObject([{ key: load.steps[0].key, fields: ['instruction'] }]);
    expect(d.added).toHaveLength(1);
    expect(d.added[0].step.instruction).toBe('Clothing check after the fill.');
    // The other way round, added and removed swap.
    const back = (await operator.get(`/api/procedures/${id}/diff?from=2&to=1`).expect(200)).body;
    expect(back.added.map((x: { key: string }) => x.key)).toEqual([removed.key]);
    expect(back.removed.map((x: { key: string }) => x.key)).toEqual([d.added[0].key]);
  });
});
