import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { msUntilDigest } from '../../server/mail/notify';
import { User } from '../../server/models';
import { DEMO } from '../helpers/api';
import { startTestApp, waitForMail, type TestApp, type TestClient } from '../helpers/app';
import { demoRevision } from '../helpers/counts';
import { createProcedure, put, sampleContent } from '../helpers/procedures';

let t: TestApp;
let admin: TestClient;
let conductor: TestClient;
let safety: TestClient;
let prop: TestClient;
let pad: TestClient;
let propId: number;
let padId: number;

type Mail = { to: string; subject: string; text: string };
const outbox = async (): Promise<Mail[]> => (await admin.get('/api/mail/outbox').expect(200)).body;
const mailsFor = async (to: string, subject: RegExp) => (await outbox()).filter((m) => m.to.includes(to) && subject.test(m.subject));

beforeAll(async () => {
  t = await startTestApp();
  [admin, conductor, safety, prop, pad] = await Promise.all([DEMO.admin, DEMO.conductor, DEMO.safety, DEMO.propellants, DEMO.pad].map((e) => t.client(e)));
  propId = (await User.findOne({ where: { email: DEMO.propellants } }))!.id;
  padId = (await User.findOne({ where: { email: DEMO.pad } }))!.id;
});
afterAll(() => t.stop());

async function countWithCrew(name: string) {
  const rev = await demoRevision(conductor);
  await conductor
    .post('/api/counts', { ...rev, name, reportAt: '2026-12-12T06:30:00Z', crew: [{ station: 'PROP', userIds: [propId] }, { station: 'PAD', userIds: [padId] }] })
    .expect(201);
  await t.holdfire.notifier.settle();
}

describe('notice choices', () => {
  it('start with every notice at once, and refuse a bad choice without changing anything', async () => {
    const fresh = (await pad.get('/api/profile/notifications').expect(200)).body;
    expect(fresh).toEqual({
      prefs: {
        'count-scheduled': 'immediate',
        'scrub-notice': 'immediate',
        'count-report': 'immediate',
        'acceptance-needed': 'immediate',
        'signoff-needed': 'immediate',
        'action-assigned': 'immediate',
      },
      digestHourUtc: 6,
      waiting: 0,
    });
    const bad = await put(pad, '/api/profile/notifications', { 'count-report': 'sometimes' }).expect(400);
    expect(bad.body.details[0].path).toBe('count-report');
    await put(pad, '/api/profile/notifications', { 'carrier-pigeon': 'off' }).expect(400);
    expect((await pad.get('/api/profile/notifications').expect(200)).body).toEqual(fresh);
    await (await t.client()).get('/api/profile/notifications').expect(401);
  });
});

describe('a count’s crew', () => {
  it('is told their own station and when to report, at once', async () => {
    await countWithCrew('Cold-flow rehearsal A');
    const mail = await waitForMail(admin, DEMO.pad);
    expect(mail.subject).toBe('On the crew: Cold-flow rehearsal A, report 2026-12-12 06:30 UTC');
    expect(mail.text).toContain('Your station: PAD.');
    expect(mail.text).toContain('Report at: 2026-12-12 06:30 UTC.');
    expect(mail.text).toMatch(/\/counts\/\d+/);
    expect(mail.text).toContain('not a safety authority');
  });

  it('gets nothing when they turned the notice off, and one digest a day when they chose it', async () => {
    await put(pad, '/api/profile/notifications', { 'count-scheduled': 'off' }).expect(200);
    const saved = (await put(prop, '/api/profile/notifications', { 'count-scheduled': 'digest' }).expect(200)).body;
    expect(saved.prefs).toMatchObject({ 'count-scheduled': 'digest', 'count-report': 'immediate' });
    const before = (await outbox()).length;

    await countWithCrew('Cold-flow rehearsal B');
    await countWithCrew('Cold-flow rehearsal C');
    expect((await outbox()).length).toBe(before);
    expect((await prop.get('/api/profile/notifications').expect(200)).body.waiting).toBe(2);
    expect((await pad.get('/api/profile/notifications').expect(200)).body.waiting).toBe(0);

    expect(await t.holdfire.notifier.sendDigests()).toBe(1);
    const digest = await waitForMail(admin, DEMO.propellants);
    const digests = await mailsFor(DEMO.propellants, /daily digest/);
    expect(digests).toHaveLength(1);
    expect(digests[0]!.subject).toBe('Holdfire daily digest: 2 notices');
    expect(digest.text).toMatch(/1\. On the crew: Cold-flow rehearsal B[\s\S]*2\. On the crew: Cold-flow rehearsal C/);
    expect(digest.text).toContain('Your station: PROP.');
    // Sent once: the next digest has nothing to send.
    expect((await prop.get('/api/profile/notifications').expect(200)).body.waiting).toBe(0);
    expect(await t.holdfire.notifier.sendDigests()).toBe(0);
  });
});

describe('asking for a signature', () => {
  it('a hazard awaiting acceptance tells those who hold the roles that accept it', async () => {
    // Residual 2C is Serious (MIL-STD-882E Table III); the default acceptance map asks safety and admin.
    const h = (
      await safety
        .post('/api/hazards', { title: 'Notice test: purge line kink', system: 'feed-system', phase: 'firing', causes: ['Kink'], effects: ['No purge'], propellants: [], initialSeverity: 2, initialLikelihood: 'C', residualSeverity: 2, residualLikelihood: 'C' })
        .expect(201)
    ).body;
    await safety.post(`/api/hazards/${h.id}/status`, { to: 'awaiting-acceptance', note: 'Kink guard fitted' }).expect(200);
    await t.holdfire.notifier.settle();
    const toAdmin = await mailsFor(DEMO.admin, /Acceptance needed/);
    expect(toAdmin).toHaveLength(1);
    expect(toAdmin[0]!.subject).toBe(`Acceptance needed: ${h.code} Notice test: purge line kink`);
    expect(toAdmin[0]!.text).toContain('Note: Kink guard fitted');
    // Not the person who asked, nor anyone without an accepting role.
    expect(await mailsFor(DEMO.safety, /Acceptance needed/)).toHaveLength(0);
    expect(await mailsFor(DEMO.auditor, /Acceptance needed/)).toHaveLength(0);
  });

  it('one procedure signature tells the other role’s holders; the releasing one tells nobody', async () => {
    const p = await createProcedure(conductor, 'Notice test procedure');
    await put(conductor, `/api/procedures/${p.id}/revisions/1`, sampleContent()).expect(200);
    await conductor.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'conductor' }).expect(201);
    await t.holdfire.notifier.settle();
    const toSafety = await mailsFor(DEMO.safety, /Sign-off needed: Notice test procedure/);
    expect(toSafety).toHaveLength(1);
    expect(toSafety[0]!.text).toContain('as test conductor');
    expect(toSafety[0]!.text).toContain(`/procedures/${p.id}/revisions/1`);
    expect(await mailsFor(DEMO.conductor, /Sign-off needed: Notice test procedure/)).toHaveLength(0);
    const before = (await outbox()).length;
    await safety.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'safety' }).expect(201);
    await t.holdfire.notifier.settle();
    expect((await outbox()).length).toBe(before);
  });
});

describe('the digest time', () => {
  it('is the next occurrence of the hour, today or tomorrow', () => {
    // Worked by hand: from 05:30 UTC the 06:00 digest is 30 min away; from 06:00 exactly, a day away.
    expect(msUntilDigest(new Date('2026-12-02T05:30:00Z'), 6)).toBe(30 * 60_000);
    expect(msUntilDigest(new Date('2026-12-02T06:00:00Z'), 6)).toBe(24 * 3_600_000);
    expect(msUntilDigest(new Date('2026-12-31T23:00:00Z'), 6)).toBe(7 * 3_600_000);
  });
});
