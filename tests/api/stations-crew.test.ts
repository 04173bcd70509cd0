import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../server/models';
import { createUser, DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { createProcedure, del, put, sampleContent } from '../helpers/procedures';

let t: TestApp;
let conductor: TestClient;
let admin: TestClient;
let safety: TestClient;
let operator: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  [conductor, admin, safety, operator] = await Promise.all([t.client(DEMO.conductor), t.client(DEMO.admin), t.client(DEMO.safety), t.client(DEMO.propellants)]);
});
afterAll(() => t.stop());

type StationBody = { id: number; code: string; name: string; callSign: string; defaultPpe: string[] };
const stations = async (): Promise<StationBody[]> => (await operator.get('/api/stations').expect(200)).body;

describe('stations', () => {
  it('lists the demo team\'s stations with call signs and PPE to everyone signed in', async () => {
    const list = await stations();
    expect(list.map((s) => s.code)).toEqual(['TC', 'PROP', 'PAD', 'DATA', 'RANGE', 'SAFE', 'FIRE']);
    expect(list.find((s) => s.code === 'PROP')).toMatchObject({ name: 'Propellants', callSign: 'Props' });
    expect(list.find((s) => s.code === 'PROP')!.defaultPpe.some((p) => /cryogenic gloves/.test(p))).toBe(true);
    await (await t.client()).get('/api/stations').expect(401);
  });

  it('admin and conductor create, edit and delete; codes are upper-cased and unique', async () => {
    const made = (await conductor.post('/api/stations', { code: 'cam', name: 'Cameras', callSign: 'Eyes' }).expect(201)).body;
    expect(made).toMatchObject({ code: 'CAM', defaultPpe: [] });
    expect((await admin.post('/api/stations', { code: 'CAM', name: 'Other', callSign: 'Other' }).expect(409)).body.code).toBe('station_code_taken');
    const edited = (await admin.patch(`/api/stations/${made.id}`, { code: 'CAM2', defaultPpe: ['Hearing protection'] }).expect(200)).body;
    expect(edited).toMatchObject({ code: 'CAM2', defaultPpe: ['Hearing protection'] });
    await del(conductor, `/api/stations/${made.id}`).expect(204);
    expect((await stations()).some((s) => s.id === made.id)).toBe(false);
  });

  it('operators and safety officers get 403; bad input is 400 with paths', async () => {
    for (const c of [operator, safety]) await c.post('/api/stations', { code: 'XX', name: 'x', callSign: 'x' }).expect(403);
    const res = await admin.post('/api/stations', { code: '1bad', name: '', callSign: 'x'.repeat(41) }).expect(400);
    expect(res.body.details.map((d: { path: string }) => d.path).sort()).toEqual(['callSign', 'code', 'name']);
    await admin.patch('/api/stations/1', {}).expect(400);
    await admin.patch('/api/stations/99999', { name: 'x' }).expect(404);
    expect((await stations()).map((s) => s.code)).not.toContain('1BAD');
  });

  it('a station a procedure uses keeps its code and cannot be deleted', async () => {
    const pad = (await stations()).find((s) => s.code === 'PAD')!;
    const rename = await admin.patch(`/api/stations/${pad.id}`, { code: 'PADS' }).expect(409);
    expect(rename.body.code).toBe('station_in_use');
    expect(rename.body.error).toMatch(/Kestrel-2 static fire, revision 1/);
    await admin.patch(`/api/stations/${pad.id}`, { name: 'Pad and pressurant systems' }).expect(200);
    expect((await del(admin, `/api/stations/${pad.id}`).expect(409)).body.code).toBe('station_in_use');
    // A station only a crew plan uses cannot be deleted either.
    const spare = (await admin.post('/api/stations', { code: 'SPARE', name: 'Spare', callSign: 'Spare' }).expect(201)).body;
    const me = (await admin.get('/api/auth/me').expect(200)).body;
    await admin.post('/api/crew-plans', { name: 'Spare plan', assignments: [{ stationId: spare.id, userId: me.id }] }).expect(201);
    expect((await del(admin, `/api/stations/${spare.id}`).expect(409)).body.error).toMatch(/crew plan/);
    expect((await stations()).map((s) => s.code)).toEqual(expect.arrayContaining(['PAD', 'SPARE']));
  });
});

describe('crew plans and the manning check', () => {
  it('the demo crew plan mans every station the Kestrel-2 procedure needs', async () => {
    const plans = (await operator.get('/api/crew-plans').expect(200)).body;
    const demo = plans.find((p: { name: string }) => p.name.startsWith('Kestrel-2'));
    expect(demo).toMatchObject({ procedureName: 'Kestrel-2 static fire', testDate: '2025-05-17' });
    expect(demo.assignments.find((a: { stationCode: string }) => a.stationCode === 'TC').userName).toBe('Marek Lindqvist');
    const check = (await operator.get(`/api/crew-plans/${demo.id}/manning`).expect(200)).body;
    expect(check).toMatchObject({ ok: true, unmanned: [], unknownStations: [], revisionNumber: 1 });
    expect(check.stations.map((s: { station: string }) => s.station).sort()).toEqual(['DATA', 'FIRE', 'PAD', 'PROP', 'RANGE', 'SAFE', 'TC']);
  });

  it('names the stations nobody mans, and does not count a deactivated person', async () => {
    const p = await createProcedure(conductor, 'Manning test');
    await put(conductor, `/api/procedures/${p.id}/revisions/1`, sampleContent()).expect(200);
    const list = await stations();
    const code = (c: string) => list.find((s) => s.code === c)!.id;
    const leaver = await createUser({ name: 'Leaving Soon', roles: ['operator'] });
    const me = (await conductor.get('/api/auth/me').expect(200)).body;
    const plan = (
      await conductor
        .post('/api/crew-plans', {
          name: 'Short crew',
          procedureId: p.id,
          testDate: '2025-06-01',
          assignments: [
            { stationId: code('TC'), userId: me.id },
            { stationId: code('PAD'), userId: me.id },
            { stationId: code('SAFE'), userId: leaver.id },
          ],
        })
        .expect(201)
    ).body;
    let check = (await operator.get(`/api/crew-plans/${plan.id}/manning`).expect(200)).body;
    // sampleContent needs PAD, PROP, TC and SAFE (its poll names PAD and SAFE).
    expect(check.ok).toBe(false);
    expect(check.unmanned).toEqual(['PROP']);
    expect(check.doubled).toEqual([{ userId: me.id, userName: 'Marek Lindqvist', stations: ['TC', 'PAD'] }]);
    await User.update({ active: false }, { where: { id: leaver.id } });
    check = (await operator.get(`/api/crew-plans/${plan.id}/manning`).expect(200)).body;
    expect(check.unmanned).toEqual(['SAFE', 'PROP']); // in order of first use
    expect(check.inactive).toEqual([{ station: 'SAFE', userId: leaver.id, userName: 'Leaving Soon' }]);
    // The same plan can be checked against another procedure.
    const other = (await operator.get(`/api/crew-plans/${plan.id}/manning?procedureId=1&revision=2`).expect(200)).body;
    expect(other).toMatchObject({ procedureId: 1, revisionNumber: 2, ok: false });
    // A deactivated person cannot be assigned again.
    const again = await put(conductor, `/api/crew-plans/${plan.id}`, { name: 'Short crew', assignments: [{ stationId: code('SAFE'), userId: leaver.id }] }).expect(400);
    expect(again.body.details).toEqual([{ path: 'assignments.0.userId', message: "Leaving Soon's account is deactivated." }]);
  });

  it('replaces and deletes plans; refuses other teams\' ids, duplicates and bad dates at their paths', async () => {
    const list = await stations();
    const plan = (await admin.post('/api/crew-plans', { name: 'Test day, no procedure', testDate: '2025-06-14' }).expect(201)).body;
    expect(plan).toMatchObject({ procedureId: null, assignments: [] });
    const noProc = await operator.get(`/api/crew-plans/${plan.id}/manning`).expect(400);
    expect(noProc.body.code).toBe('procedure_required');
    const bad = await put(admin, `/api/crew-plans/${plan.id}`, {
      name: 'x',
      procedureId: 99999,
      assignments: [
        { stationId: 99999, userId: 1 },
        { stationId: list[0]!.id, userId: 99999 },
        { stationId: list[0]!.id, userId: 1 },
        { stationId: list[0]!.id, userId: 1 },
      ],
    }).expect(400);
    expect(bad.body.details.map((d: { path: string }) => d.path)).toEqual(['procedureId', 'assignments.0.stationId', 'assignments.1.userId', 'assignments.3']);
    expect((await put(admin, `/api/crew-plans/${plan.id}`, { name: 'x', testDate: '17/05/2025' }).expect(400)).body.details[0].path).toBe('testDate');
    expect((await operator.get(`/api/crew-plans/${plan.id}`).expect(200)).body.name).toBe('Test day, no procedure');
    const replaced = (await put(admin, `/api/crew-plans/${plan.id}`, { name: 'Test day', procedureId: 1, assignments: [{ stationId: list[0]!.id, userId: 1 }] }).expect(200)).body;
    expect(replaced).toMatchObject({ name: 'Test day', procedureId: 1, assignments: [{ stationCode: 'TC', userName: 'Ines Okafor' }] });
    await put(operator, `/api/crew-plans/${plan.id}`, { name: 'x' }).expect(403);
    await del(safety, `/api/crew-plans/${plan.id}`).expect(403);
    await del(admin, `/api/crew-plans/${plan.id}`).expect(204);
    await operator.get(`/api/crew-plans/${plan.id}`).expect(404);
  });

  it('lists the active people a crew can be drawn from to those who write crew plans', async () => {
    const people = (await conductor.get('/api/crew-plans/people').expect(200)).body as { id: number; name: string; roles: string[] }[];
    expect(people.map((p) => p.name)).toContain('Tomasz Reyes');
    expect(people.find((p) => p.name === 'Priya Halloran')!.roles).toEqual(['safety']);
    expect(Object.keys(people[0]!).sort()).toEqual(['id', 'name', 'roles']);
    // 'Leaving Soon' was deactivated by the crew plan test above.
    const leaver = await User.findOne({ where: { active: false } });
    expect(leaver).not.toBeNull();
    expect(people.some((p) => p.id === leaver!.id)).toBe(false);
    await operator.get('/api/crew-plans/people').expect(403);
    await safety.get('/api/crew-plans/people').expect(403);
  });
});
