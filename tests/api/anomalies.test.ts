import { readdirSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoAnomalies } from '../../server/db/seed-anomalies';
import { Anomaly, CorrectiveAction, Hazard, HazardHistory, Team, User } from '../../server/models';
import { UPLOAD_MAX_BYTES } from '../../src/contract/uploads';
import { DEMO, mailsTo } from '../helpers/api';
import { startTestApp, waitForMail, type TestApp, type TestClient } from '../helpers/app';
import { releasedShortProcedure } from '../helpers/counts';
import { makePng } from '../helpers/png';
import { del } from '../helpers/procedures';

let t: TestApp;
let conductor: TestClient;
let safety: TestClient;
let prop: TestClient;
let auditor: TestClient;
let admin: TestClient;

/** The short test count: started at T-15 s, held by a redline on its reading. */
const count = { id: 0, procedureId: 0, createdAt: 0, startedAt: 0, holdAt: 0 };

async function until(check: () => Promise<boolean>, timeoutMs = 10_000) {
  const end = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > end) throw new Error('condition not met in time');
    await new Promise((r) => setTimeout(r, 50));
  }
}
const command = (c: TestClient, id: number, body: object) => c.post(`/api/counts/${id}/commands`, body);

beforeAll(async () => {
  t = await startTestApp();
  [conductor, safety, prop, auditor, admin] = await Promise.all([DEMO.conductor, DEMO.safety, DEMO.propellants, DEMO.auditor, DEMO.admin].map((e) => t.client(e)));
  const { procedureId, revisionId } = await releasedShortProcedure(conductor, safety, 'Kestrel-2 short run for anomalies');
  const res = await conductor.post('/api/counts', { procedureId, revisionId, name: 'Kestrel-2 short run' }).expect(201);
  count.id = res.body.id;
  count.procedureId = procedureId;
  await command(conductor, count.id, { type: 'count:start' }).expect(200);
  const reading = res.body.state.plan.steps.find((s: { kind: string }) => s.kind === 'reading');
  // As in tests/api/counts.test.ts: a reading tried before its step is reached, then the step waited for.
  await command(prop, count.id, { type: 'reading:record', stepKey: reading.key, value: 12 });
  await until(async () => (await conductor.get(`/api/counts/${count.id}/state`)).body.steps[reading.key]?.status === 'current');
  await command(prop, count.id, { type: 'reading:record', stepKey: reading.key, value: 14.6 }).expect(200);
  const events = (await conductor.get(`/api/counts/${count.id}/events`).expect(200)).body as { type: string; at: number }[];
  count.createdAt = events.find((e) => e.type === 'count:created')!.at;
  count.startedAt = events.find((e) => e.type === 'count:started')!.at;
  count.holdAt = events.find((e) => e.type === 'hold:called')!.at;
});
afterAll(() => t.stop());

const base = { title: 'Fuel inlet pressure spike', description: 'The inlet transducer read a spike above its redline.', severity: 2 };
const report = (c: TestClient, body: object) => c.post('/api/anomalies', body);
const anomalyCount = () => Anomaly.count();

/**
 * The expected T is worked out here by hand from the log's own times, not with the domain's functions: the count
 * started at T-15 s and a count clock runs one second per second until a hold stops it, then stands still (the
 * trade's meaning of a hold; common practice, no source). Shown as the console's clock shows it, by floor.
 */
function expectedT(at: number): number {
  return -15 + (Math.min(at, count.holdAt) - count.startedAt) / 1000;
}

describe('reporting', () => {
  it('at an instant of a count: T and the status there come from the count log', async () => {
    const res = await report(prop, { ...base, countId: count.id, at: count.holdAt, immediateActions: 'Held; line vented.' }).expect(201);
    expect(res.body).toMatchObject({ countId: count.id, countName: 'Kestrel-2 short run', atMs: count.holdAt, countStatus: 'holding', status: 'open', severity: 2, severityLabel: '2 Critical' });
    expect(res.body.ref).toMatch(/^AN-\d{3}$/);
    expect(res.body.tSeconds).toBeCloseTo(expectedT(count.holdAt), 3);
    expect(res.body.tText).toBe(`T-0:${String(-Math.floor(expectedT(count.holdAt))).padStart(2, '0')}`);
    expect(res.body.history[0].text).toMatch(/^Reported AN-\d{3} “Fuel inlet pressure spike” in the count “Kestrel-2 short run” at T-0:1\d \(holding\), severity 2 Critical\.$/);
    expect(res.body.history[0].userName).toBe('Tomasz Reyes');

    // Five seconds into the hold the clock has stood still: the same T, still holding.
    const later = await report(conductor, { ...base, countId: count.id, at: count.holdAt + 5000 }).expect(201);
    expect(later.body.tSeconds).toBeCloseTo(res.body.tSeconds, 6);
    expect(later.body.countStatus).toBe('holding');

    // Half a second after the start: T-14.5 s, shown by floor as T-0:15, and counting.
    const early = await report(conductor, { ...base, countId: count.id, at: count.startedAt + 500 }).expect(201);
    expect(early.body.tSeconds).toBeCloseTo(-14.5, 6);
    expect(early.body.tText).toBe('T-0:15');
    expect(early.body.countStatus).toBe('counting');
  });

  it('before the count started there is no T; before it was made, or in the future, is refused', async () => {
    if (count.startedAt > count.createdAt) {
      const res = await report(conductor, { ...base, countId: count.id, at: count.createdAt }).expect(201);
      expect(res.body).toMatchObject({ tSeconds: null, tText: null, countStatus: 'ready' });
    }
    const before = await anomalyCount();
    const early = await report(conductor, { ...base, countId: count.id, at: count.createdAt - 1 }).expect(400);
    expect(early.body.details[0]).toMatchObject({ path: 'at' });
    expect(early.body.error).toMatch(/before the count was made/);
    await report(conductor, { ...base, countId: count.id, at: Date.now() + 3_600_000 }).expect(400);
    expect(await anomalyCount()).toBe(before);
  });

  it('with no count (found at a walk-down): no T, the instant defaults to now', async () => {
    const from = Date.now();
    const res = await report(safety, { ...base, title: 'Cracked ferrule found at the walk-down', severity: '3' }).expect(201);
    expect(res.body).toMatchObject({ countId: null, countName: null, tSeconds: null, tText: null, countStatus: null, severityLabel: '3 Marginal' });
    expect(res.body.atMs).toBeGreaterThanOrEqual(from);
    expect(res.body.history[0].text).toMatch(/outside a count/);
  });

  it('refuses bad input with a clear 400 at the field and saves nothing', async () => {
    const before = await anomalyCount();
    const cases: [object, string][] = [
      [{ ...base, title: '  ' }, 'title'],
      [{ ...base, severity: 7 }, 'severity'],
      [{ ...base, countId: count.id }, 'at'],
      [{ ...base, countId: 999_999, at: count.holdAt }, 'countId'],
      [{ ...base, at: 1.5 }, 'at'],
      [{ ...base, surprise: true }, '(body)'],
    ];
    for (const [body, field] of cases) {
      const res = await report(conductor, body).expect(400);
      expect(res.body.details.map((d: { path: string }) => d.path)).toContain(field);
    }
    const sev = await report(conductor, { ...base, severity: 7 });
    expect(sev.body.error).toMatch(/Choose a severity of .*1 \(Catastrophic\)/);
    expect(await anomalyCount()).toBe(before);
  });

  it('is open to conductor, safety, admin and operators; auditors and strangers only read', async () => {
    for (const c of [admin]) await report(c, base).expect(201);
    const refused = await report(auditor, base).expect(403);
    expect(refused.body.code).toBe('forbidden');
    const anonymous = await t.client();
    await anonymous.get('/api/anomalies').expect(401);
    const list = await auditor.get('/api/anomalies').expect(200);
    expect(list.body.length).toBeGreaterThan(0);
    await auditor.get(`/api/anomalies/${list.body[0].id}`).expect(200);
  });

  it('edits are kept in words; the count and instant stay as reported', async () => {
    const a = (await report(prop, base).expect(201)).body;
    const res = await prop.patch(`/api/anomalies/${a.id}`, { title: 'Fuel inlet pressure surge', severity: 1 }).expect(200);
    expect(res.body).toMatchObject({ title: 'Fuel inlet pressure surge', severityLabel: '1 Catastrophic' });
    const texts = res.body.history.map((h: { text: string }) => h.text);
    expect(texts).toContain('Changed the title from “Fuel inlet pressure spike” to “Fuel inlet pressure surge”.');
    expect(texts).toContain('Changed the severity from “2 Critical” to “1 Catastrophic”.');
    await prop.patch(`/api/anomalies/${a.id}`, { countId: count.id }).expect(400);
    await prop.patch(`/api/anomalies/${a.id}`, { severity: 'Z' }).expect(400);
    expect((await prop.get(`/api/anomalies/${a.id}`).expect(200)).body.severityLabel).toBe('1 Catastrophic');
  });
});

describe('the list', () => {
  it('filters by count, hazard and status, and its items carry countId and hazardIds', async () => {
    const inCount = (await report(conductor, { ...base, title: 'In the count', countId: count.id, at: count.holdAt }).expect(201)).body;
    const outside = (await report(conductor, { ...base, title: 'Outside' }).expect(201)).body;
    await safety.post(`/api/anomalies/${inCount.id}/hazards`, { hazardId: 1 }).expect(201);
    await safety.post(`/api/anomalies/${inCount.id}/hazards`, { hazardId: 2 }).expect(201);

    const byCount = (await conductor.get(`/api/anomalies?countId=${count.id}`).expect(200)).body as { id: number; countId: number }[];
    expect(byCount.map((a) => a.id)).toContain(inCount.id);
    expect(byCount.map((a) => a.id)).not.toContain(outside.id);
    expect(byCount.every((a) => a.countId === count.id)).toBe(true);

    const byHazard = (await conductor.get('/api/anomalies?hazardId=2').expect(200)).body as { id: number; hazardIds: number[] }[];
    expect(byHazard.map((a) => a.id)).toEqual([inCount.id]);
    expect(byHazard[0]!.hazardIds).toEqual([1, 2]);

    const all = (await conductor.get('/api/anomalies').expect(200)).body as { id: number; hazardIds: number[]; countId: number | null }[];
    expect(all.find((a) => a.id === outside.id)).toMatchObject({ countId: null, hazardIds: [] });
    const closed = (await conductor.get('/api/anomalies?status=closed').expect(200)).body as { status: string }[];
    expect(closed.every((a) => a.status === 'closed')).toBe(true);
    await conductor.get('/api/anomalies?status=shut').expect(400);
    await conductor.get('/api/anomalies?countId=abc').expect(400);
  });

  it('links a hazard once; the hazard keeps the link in its history; unlinking is recorded too', async () => {
    const a = (await report(conductor, base).expect(201)).body;
    await conductor.post(`/api/anomalies/${a.id}/hazards`, { hazardId: 3 }).expect(201);
    const again = await conductor.post(`/api/anomalies/${a.id}/hazards`, { hazardId: 3 }).expect(409);
    expect(again.body.error).toMatch(/already linked/);
    await conductor.post(`/api/anomalies/${a.id}/hazards`, { hazardId: 99_999 }).expect(400);
    const hist = await HazardHistory.findAll({ where: { hazardId: 3, field: 'anomaly' } });
    expect(hist.map((h) => h.after)).toContain(`${a.ref} ${a.title}`);
    const res = await del(conductor, `/api/anomalies/${a.id}/hazards/3`).expect(200);
    expect(res.body.hazardIds).toEqual([]);
    expect(res.body.history.at(-1).text).toMatch(/^Unlinked the hazard HZ-003/);
  });
});

describe('a new hazard from an anomaly', () => {
  it('is added to the register and linked in one step, by safety or admin only', async () => {
    const a = (await report(prop, base).expect(201)).body;
    const input = { title: a.title, system: 'feed-system', phase: 'firing', description: a.description, causes: [a.description], effects: [], initialSeverity: 2, initialLikelihood: 'C' };
    await prop.post(`/api/anomalies/${a.id}/hazards/new`, input).expect(403);
    const before = await Hazard.count();
    await safety.post(`/api/anomalies/${a.id}/hazards/new`, { ...input, initialSeverity: 9 }).expect(400);
    expect(await Hazard.count()).toBe(before);
    const h = (await safety.post(`/api/anomalies/${a.id}/hazards/new`, input).expect(201)).body;
    expect(h).toMatchObject({ title: a.title, causes: [a.description] });
    const after = (await prop.get(`/api/anomalies/${a.id}`).expect(200)).body;
    expect(after.hazardIds).toEqual([h.id]);
    const hist = (await safety.get(`/api/hazards/${h.id}/history`).expect(200)).body as { field: string; after: unknown }[];
    expect(hist.map((e) => e.field)).toEqual(['created', 'anomaly']);
    expect(hist[1]!.after).toBe(`${a.ref} ${a.title}`);
  });
});

describe('photos and files', () => {
  const attach = (c: TestClient, id: number, bytes: Buffer, name: string, type: string) =>
    c.agent.post(`/api/anomalies/${id}/attachments`).set('X-CSRF-Token', c.csrf).field('caption', 'Inlet gauge').attach('file', bytes, { filename: name, contentType: type });
  const stored = () => readdirSync(path.join(t.holdfire.config.dataDir, 'uploads')).length;

  it('keeps a real photo, served to the team', async () => {
    const a = (await report(prop, base).expect(201)).body;
    const res = await attach(prop, a.id, makePng(), 'gauge.png', 'image/png').expect(201);
    expect(res.body.attachments).toHaveLength(1);
    expect(res.body.attachments[0]).toMatchObject({ caption: 'Inlet gauge', addedBy: 'Tomasz Reyes', file: { name: 'gauge.png', mediaType: 'image/png' } });
    const file = await auditor.get(res.body.attachments[0].file.url).expect(200);
    expect(file.headers['content-type']).toBe('image/png');
    const removed = await del(prop, `/api/anomalies/${a.id}/attachments/${res.body.attachments[0].id}`).expect(200);
    expect(removed.body.attachments).toHaveLength(0);
  });

  it('refuses a spoofed type (415) and a file too big (413), storing nothing; auditors cannot attach', async () => {
    const a = (await report(prop, base).expect(201)).body;
    const files = stored();
    const spoofed = await attach(prop, a.id, Buffer.from('<script>alert(1)</script>'), 'photo.png', 'image/png').expect(415);
    expect(spoofed.body.error).toMatch(/read from the file's content/);
    const big = Buffer.concat([makePng(), Buffer.alloc(UPLOAD_MAX_BYTES + 1 - makePng().length + 1)]);
    const tooBig = await attach(prop, a.id, big, 'big.png', 'image/png').expect(413);
    expect(tooBig.body.code).toBe('file_too_large');
    await attach(auditor, a.id, makePng(), 'gauge.png', 'image/png').expect(403);
    expect(stored()).toBe(files);
    expect((await prop.get(`/api/anomalies/${a.id}`).expect(200)).body.attachments).toHaveLength(0);
  });
});

describe('corrective actions and closing', () => {
  it('mails the owner when an action is assigned or reassigned', async () => {
    const a = (await report(conductor, base).expect(201)).body;
    const owner = await User.findOne({ where: { email: DEMO.pad } });
    const res = await conductor.post(`/api/anomalies/${a.id}/actions`, { description: 'Re-zero the inlet transducer', ownerId: owner!.id, dueDate: '2031-05-20' }).expect(201);
    expect(res.body.actions[0]).toMatchObject({ ownerName: 'Aiko Brennan', status: 'open', dueDate: '2031-05-20' });
    // Counts made earlier told the crew of their stations: this is the corrective action's notice.
    const mail = await waitForMail(admin, DEMO.pad, 5000, /^Corrective action/);
    expect(mail.subject).toBe(`Corrective action for ${a.ref}: due 2031-05-20`);
    expect(mail.text).toContain('Re-zero the inlet transducer');
    expect(mail.text).toContain(`http://holdfire.test/anomalies/${a.id}`);

    const other = await User.findOne({ where: { email: DEMO.data } });
    const moved = await conductor.patch(`/api/anomalies/${a.id}/actions/${res.body.actions[0].id}`, { ownerId: other!.id }).expect(200);
    expect(moved.body.history.at(-1).text).toBe('Gave the corrective action “Re-zero the inlet transducer” to Noor Fairweather (was Aiko Brennan).');
    await waitForMail(admin, DEMO.data, 5000, /^Corrective action/);
    // A status change alone mails nobody new.
    await conductor.patch(`/api/anomalies/${a.id}/actions/${res.body.actions[0].id}`, { status: 'in-progress' }).expect(200);
    expect((await mailsTo(admin, DEMO.pad)).filter((m) => m.subject.startsWith('Corrective action'))).toHaveLength(1);
  });

  it('refuses an owner outside the team or a bad date, adding nothing', async () => {
    const a = (await report(conductor, base).expect(201)).body;
    const other = await Team.create({ name: 'Heron Flats Propulsion Club', site: 'Heron Flats' });
    const stranger = await User.create({ teamId: other.id, email: 'pad@heronflats.test', name: 'Outside Person', passwordHash: 'x', roles: ['operator'], active: true });
    const res = await conductor.post(`/api/anomalies/${a.id}/actions`, { description: 'Do it', ownerId: stranger.id, dueDate: '2031-05-20' }).expect(400);
    expect(res.body.details[0]).toMatchObject({ path: 'ownerId' });
    await conductor.post(`/api/anomalies/${a.id}/actions`, { description: 'Do it', ownerId: 1, dueDate: '20/05/2031' }).expect(400);
    await conductor.post(`/api/anomalies/${a.id}/actions`, { description: 'Do it', ownerId: 1, dueDate: '2031-02-31x' }).expect(400);
    expect(await CorrectiveAction.count({ where: { anomalyId: a.id } })).toBe(0);
  });

  it('closes only as safety officer and only once every action is done; reopens by safety', async () => {
    const a = (await report(prop, base).expect(201)).body;
    const owner = await User.findOne({ where: { email: DEMO.propellants } });
    const withAction = (await prop.post(`/api/anomalies/${a.id}/actions`, { description: 'Slow the pre-valve', ownerId: owner!.id, dueDate: '2031-06-01' }).expect(201)).body;
    const actionId = withAction.actions[0].id;

    const refused = await safety.post(`/api/anomalies/${a.id}/close`, {}).expect(409);
    expect(refused.body).toMatchObject({ code: 'actions_not_done' });
    expect(refused.body.error).toBe(`${a.ref} cannot be closed while a corrective action is not done: “Slow the pre-valve” (open).`);
    for (const c of [prop, conductor, admin]) await c.post(`/api/anomalies/${a.id}/close`, {}).expect(403);
    expect((await prop.get(`/api/anomalies/${a.id}`).expect(200)).body.status).toBe('open');

    await prop.patch(`/api/anomalies/${a.id}/actions/${actionId}`, { status: 'done' }).expect(200);
    const closed = await safety.post(`/api/anomalies/${a.id}/close`, { note: 'Valve timing changed.' }).expect(200);
    expect(closed.body).toMatchObject({ status: 'closed', closedBy: 'Priya Halloran', openActions: 0 });
    expect(closed.body.history.at(-1).text).toBe(`Closed ${a.ref}: Valve timing changed.`);

    // Closed: nothing changes until it is reopened.
    const frozen = await prop.patch(`/api/anomalies/${a.id}`, { title: 'Changed' }).expect(409);
    expect(frozen.body.error).toMatch(/must reopen it/);
    await prop.patch(`/api/anomalies/${a.id}/actions/${actionId}`, { status: 'open' }).expect(409);
    await safety.post(`/api/anomalies/${a.id}/close`, {}).expect(409);
    await conductor.post(`/api/anomalies/${a.id}/reopen`, {}).expect(403);
    const reopened = await safety.post(`/api/anomalies/${a.id}/reopen`, { note: 'Surge seen again.' }).expect(200);
    expect(reopened.body).toMatchObject({ status: 'open', closedAt: null, closedBy: null });
    expect(reopened.body.history.at(-1)).toMatchObject({ userName: 'Priya Halloran', text: `Reopened ${a.ref}: Surge seen again.` });
  });
});

describe('lessons learned', () => {
  it('opens a draft of the chosen procedure, then links that same draft instead of making another', async () => {
    const a = (await report(conductor, { ...base, countId: count.id, at: count.holdAt }).expect(201)).body;
    const b = (await report(conductor, base).expect(201)).body;
    await prop.post(`/api/anomalies/${a.id}/lessons`, { procedureId: count.procedureId }).expect(403);
    await conductor.post(`/api/anomalies/${a.id}/lessons`, { procedureId: 99_999 }).expect(400);

    const first = (await conductor.post(`/api/anomalies/${a.id}/lessons`, { procedureId: count.procedureId }).expect(200)).body;
    expect(first).toMatchObject({ procedureId: count.procedureId, revisionNumber: 2, created: true });
    expect(first.anomaly.revisions).toEqual([expect.objectContaining({ procedureId: count.procedureId, revisionNumber: 2, revisionStatus: 'draft', drafted: true })]);
    expect(first.anomaly.history.at(-1).text).toBe('Opened revision 2 of “Kestrel-2 short run for anomalies” as a draft because of this anomaly.');
    const proc = (await conductor.get(`/api/procedures/${count.procedureId}`).expect(200)).body;
    expect(proc.draft).toEqual({ number: 2 });

    const second = (await safety.post(`/api/anomalies/${b.id}/lessons`, { procedureId: count.procedureId }).expect(200)).body;
    expect(second).toMatchObject({ revisionNumber: 2, created: false });
    expect(second.anomaly.revisions[0]).toMatchObject({ revisionNumber: 2, drafted: false });
    // Asking again for the same anomaly changes nothing.
    const again = (await conductor.post(`/api/anomalies/${a.id}/lessons`, { procedureId: count.procedureId }).expect(200)).body;
    expect(again.anomaly.revisions).toHaveLength(1);
    expect((await conductor.get(`/api/procedures/${count.procedureId}`).expect(200)).body.revisions).toHaveLength(2);

    const forProcedure = (await auditor.get(`/api/anomalies?procedureId=${count.procedureId}`).expect(200)).body as { id: number }[];
    expect(forProcedure.map((x) => x.id).sort()).toEqual([a.id, b.id].sort());
  });
});

describe('the demo anomaly', () => {
  it('is made at the redline hold of a count, linked to the surge hazard, one action done and one open', async () => {
    const team = (await Team.findOne({ order: [['id', 'ASC']] }))!;
    const users = await User.findAll({ where: { teamId: team.id } });
    const a = await seedDemoAnomalies({ countId: count.id, at: count.holdAt, users, team });
    const dto = (await auditor.get(`/api/anomalies/${a.id}`).expect(200)).body;
    expect(dto).toMatchObject({ countId: count.id, countStatus: 'holding', status: 'open', openActions: 1, severityLabel: '2 Critical', reportedBy: 'Marek Lindqvist' });
    expect(dto.tSeconds).toBeCloseTo(expectedT(count.holdAt), 3);
    expect(dto.hazards).toEqual([expect.objectContaining({ title: 'Fuel surge at main-valve opening into a hot regen jacket' })]);
    expect(dto.actions.map((x: { status: string }) => x.status)).toEqual(['done', 'open']);
    // It cannot be closed until the open action is done, like any other.
    await safety.post(`/api/anomalies/${a.id}/close`, {}).expect(409);
    // And it can be found from the hazard.
    const byHazard = (await auditor.get(`/api/anomalies?hazardId=${dto.hazards[0].id}`).expect(200)).body as { id: number }[];
    expect(byHazard.map((x) => x.id)).toContain(a.id);
  });
});

