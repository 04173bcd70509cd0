import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '../../server/auth/passwords';
import { ProcedureAttachment, Team, Upload, User } from '../../server/models';
import type { AttachmentDto, RevisionDto } from '../../src/contract/procedures';
import { UPLOAD_MAX_BYTES } from '../../src/contract/uploads';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { makePng } from '../helpers/png';
import { createProcedure, del, put, sampleContent } from '../helpers/procedures';

// Diagrams and photos on a procedure revision or one of its steps (docs/procedures.md, "Attachments").
let t: TestApp;
let conductor: TestClient;
let safety: TestClient;
let operator: TestClient;
let outsider: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  [conductor, safety, operator] = await Promise.all([t.client(DEMO.conductor), t.client(DEMO.safety), t.client(DEMO.propellants)]);
  // A second, invented team: its people must not reach the first team's files.
  const other = await Team.create({ name: 'Heron Flats Propulsion Club', site: 'Heron Flats' });
  await User.create({
    teamId: other.id,
    email: 'conductor@heronflats.test',
    name: 'Outside Conductor',
    passwordHash: await hashPassword('heron-flats-demo', 4),
    roles: ['conductor'],
    active: true,
  });
  outsider = await t.client('conductor@heronflats.test', 'heron-flats-demo');
});
afterAll(() => t.stop());

const PNG = makePng();
const uploadsDir = () => path.join(t.holdfire.config.dataDir, 'uploads');
const storedFiles = () => readdirSync(uploadsDir()).sort();
const storedPath = async (uploadId: number) => path.join(uploadsDir(), (await Upload.findByPk(uploadId))!.storedName);

interface FileArg {
  bytes: Buffer;
  name: string;
  type: string;
}

function attach(c: TestClient, id: number, rev: number, file?: FileArg, fields: { caption?: string; stepKey?: string } = {}) {
  let req = c.agent.post(`/api/procedures/${id}/revisions/${rev}/attachments`).set('X-CSRF-Token', c.csrf);
  if (fields.caption !== undefined) req = req.field('caption', fields.caption);
  if (fields.stepKey !== undefined) req = req.field('stepKey', fields.stepKey);
  if (file) req = req.attach('file', file.bytes, { filename: file.name, contentType: file.type });
  return req;
}

const png = (name = 'valve panel.png'): FileArg => ({ bytes: PNG, name, type: 'image/png' });

async function draftWithSteps(name = 'Attachment test'): Promise<{ id: number; stepKeys: string[] }> {
  const p = await createProcedure(conductor, name);
  const saved = (await put(conductor, `/api/procedures/${p.id}/revisions/1`, sampleContent()).expect(200)).body as RevisionDto;
  return { id: p.id, stepKeys: saved.phases.flatMap((ph) => ph.steps.map((s) => s.key)) };
}

async function release(id: number, rev: number) {
  await conductor.post(`/api/procedures/${id}/revisions/${rev}/signoffs`, { as: 'conductor' }).expect(201);
  await safety.post(`/api/procedures/${id}/revisions/${rev}/signoffs`, { as: 'safety' }).expect(201);
}

/** Runs `fn` and checks it stored nothing: no file on disk, no upload row, no attachment row. */
async function storesNothing(fn: () => Promise<unknown>) {
  const files = storedFiles();
  const uploads = await Upload.count();
  const links = await ProcedureAttachment.count();
  await fn();
  expect(storedFiles()).toEqual(files);
  expect(await Upload.count()).toBe(uploads);
  expect(await ProcedureAttachment.count()).toBe(links);
}

describe('attaching files to a draft', () => {
  it('attaches a diagram to the whole procedure and a photo to a step, and lists both in the revision', async () => {
    const { id, stepKeys } = await draftWithSteps();
    const first = (await attach(conductor, id, 1, png('feed system diagram.png'), { caption: 'Feed system, as built' }).expect(201)).body as RevisionDto;
    expect(first.attachments).toHaveLength(1);
    expect(first.attachments[0]).toMatchObject({
      stepKey: null,
      stepRemoved: false,
      caption: 'Feed system, as built',
      addedBy: 'Marek Lindqvist',
      file: { name: 'feed system diagram.png', mediaType: 'image/png', sizeBytes: PNG.length },
    });

    const second = (await attach(conductor, id, 1, png(), { caption: 'LOX fill valve', stepKey: stepKeys[4]! }).expect(201)).body as RevisionDto;
    const onStep = second.attachments.find((a) => a.stepKey === stepKeys[4]);
    expect(onStep).toMatchObject({ caption: 'LOX fill valve', stepRemoved: false });

    // Stored under a random name; the same bytes come back to a reader of the team.
    const stored = await storedPath(onStep!.file.id);
    expect(path.basename(stored)).toMatch(/^[0-9a-f]{32}\.png$/);
    expect(readFileSync(stored).equals(PNG)).toBe(true);
    const read = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body as RevisionDto;
    expect(read.attachments.map((a) => a.id)).toEqual(second.attachments.map((a) => a.id));
    const dl = await operator.agent.get(onStep!.file.url).expect(200);
    expect(dl.headers['content-type']).toBe('image/png');
  });

  it('an empty stepKey means the whole procedure; an empty caption is allowed', async () => {
    const { id } = await draftWithSteps();
    const res = (await attach(conductor, id, 1, png(), { stepKey: '', caption: '' }).expect(201)).body as RevisionDto;
    expect(res.attachments[0]).toMatchObject({ stepKey: null, caption: '' });
  });

  it('refuses a step that is not in the revision with 400 at stepKey, and keeps nothing', async () => {
    const { id } = await draftWithSteps();
    await storesNothing(async () => {
      const res = await attach(conductor, id, 1, png(), { stepKey: 's-nosuchstep' }).expect(400);
      expect(res.body.details).toEqual([{ path: 'stepKey', message: 'Not a step of this revision.' }]);
      const bad = await attach(conductor, id, 1, png(), { stepKey: '../../etc' }).expect(400);
      expect(bad.body.details[0].path).toBe('stepKey');
    });
  });

  it('refuses a released revision with 409 (frozen), and keeps nothing', async () => {
    const { id } = await draftWithSteps();
    await release(id, 1);
    await storesNothing(async () => {
      const res = await attach(conductor, id, 1, png()).expect(409);
      expect(res.body).toMatchObject({ code: 'revision_released', error: expect.stringContaining('frozen') });
    });
  });

  it("refuses an operator with 403 and another team's conductor with 404, and keeps nothing", async () => {
    const { id } = await draftWithSteps();
    await storesNothing(async () => {
      await attach(operator, id, 1, png()).expect(403);
      await attach(outsider, id, 1, png()).expect(404);
    });
  });

  it.each([
    ['text bytes named .png', Buffer.from('just some words, not a picture'), 'photo.png', 'image/png'],
    ['a Windows executable named .png', Buffer.concat([Buffer.from('MZ'), Buffer.alloc(58), Buffer.from([0x80, 0, 0, 0]), Buffer.alloc(64), Buffer.from('PE\0\0'), Buffer.alloc(200)]), 'photo.png', 'image/png'],
    ['HTML named .png', Buffer.from('<!doctype html><script>alert(1)</script>'), 'diagram.png', 'image/png'],
  ])('refuses %s with 415 and keeps nothing', async (_what, bytes, name, type) => {
    const { id } = await draftWithSteps();
    await storesNothing(async () => {
      const res = await attach(conductor, id, 1, { bytes, name, type }).expect(415);
      expect(res.body).toMatchObject({ code: 'file_type_not_allowed' });
    });
  });

  it('refuses a file over 10 MB with 413, and a missing file with 400, keeping nothing', async () => {
    const { id } = await draftWithSteps();
    const big = Buffer.concat([PNG, Buffer.alloc(UPLOAD_MAX_BYTES + 1 - PNG.length)]);
    await storesNothing(async () => {
      const res = await attach(conductor, id, 1, { bytes: big, name: 'huge.png', type: 'image/png' }).expect(413);
      expect(res.body).toMatchObject({ code: 'file_too_large' });
      await attach(conductor, id, 1, undefined, { caption: 'no file' }).expect(400);
      await attach(conductor, id, 1, png(), { caption: 'x'.repeat(201) }).expect(400);
    });
  });

  it('withdraws sign-offs when the attachments of a signed draft change', async () => {
    const { id } = await draftWithSteps();
    await conductor.post(`/api/procedures/${id}/revisions/1/signoffs`, { as: 'conductor' }).expect(201);
    const res = (await attach(conductor, id, 1, png()).expect(201)).body;
    expect(res.signoffsCleared).toBe(true);
    expect(res.signoffs).toEqual([]);
  });
});

describe('attachments across revisions', () => {
  it('a new draft links the same files; deleting keeps a file another revision uses and removes it with its last link', async () => {
    const { id, stepKeys } = await draftWithSteps();
    const one = (await attach(conductor, id, 1, png(), { stepKey: stepKeys[0]!, caption: 'GN2 bottle' }).expect(201)).body as RevisionDto;
    const a1 = one.attachments[0]!;
    await release(id, 1);

    const two = (await conductor.post(`/api/procedures/${id}/revisions`).expect(201)).body as RevisionDto;
    expect(two.attachments).toHaveLength(1);
    const a2 = two.attachments[0]!;
    expect(a2.id).not.toBe(a1.id);
    expect(a2).toMatchObject({ stepKey: stepKeys[0], caption: 'GN2 bottle', file: { id: a1.file.id } });
    const file = await storedPath(a1.file.id);

    // The released revision is frozen: its link cannot be removed.
    await del(conductor, `/api/procedures/${id}/revisions/1/attachments/${a1.id}`).expect(409);
    // Removed from the draft: revision 1 still shows it, so the file stays.
    const after = (await del(conductor, `/api/procedures/${id}/revisions/2/attachments/${a2.id}`).expect(200)).body as RevisionDto;
    expect(after.attachments).toEqual([]);
    expect(existsSync(file)).toBe(true);
    expect(await Upload.findByPk(a1.file.id)).not.toBeNull();
    const still = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body as RevisionDto;
    expect(still.attachments.map((a: AttachmentDto) => a.id)).toEqual([a1.id]);
    await del(conductor, `/api/procedures/${id}/revisions/2/attachments/${a2.id}`).expect(404);

    // A file only the draft has goes when it is removed.
    const added = (await attach(conductor, id, 2, png('only in draft.png')).expect(201)).body as RevisionDto;
    const own = added.attachments[0]!;
    const ownFile = await storedPath(own.file.id);
    await del(operator, `/api/procedures/${id}/revisions/2/attachments/${own.id}`).expect(403);
    await del(conductor, `/api/procedures/${id}/revisions/2/attachments/${own.id}`).expect(200);
    expect(existsSync(ownFile)).toBe(false);
    expect(await Upload.findByPk(own.file.id)).toBeNull();
  });

  it('discarding a draft removes its links and only the files no other revision uses', async () => {
    const { id } = await draftWithSteps();
    const one = (await attach(conductor, id, 1, png('shared.png')).expect(201)).body as RevisionDto;
    await release(id, 1);
    await conductor.post(`/api/procedures/${id}/revisions`).expect(201);
    const two = (await attach(conductor, id, 2, png('draft only.png')).expect(201)).body as RevisionDto;
    const draftOnly = two.attachments.find((a) => a.file.id !== one.attachments[0]!.file.id)!;
    const shared = await storedPath(one.attachments[0]!.file.id);
    const own = await storedPath(draftOnly.file.id);

    await del(conductor, `/api/procedures/${id}/revisions/2`).expect(200);
    expect(existsSync(shared)).toBe(true);
    expect(existsSync(own)).toBe(false);
    expect(await Upload.findByPk(draftOnly.file.id)).toBeNull();
    expect(await ProcedureAttachment.count({ where: { uploadId: draftOnly.file.id } })).toBe(0);
    expect(((await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body as RevisionDto).attachments).toHaveLength(1);
  });

  it('keeps a file whose step was deleted, marked stepRemoved', async () => {
    const { id, stepKeys } = await draftWithSteps();
    await attach(conductor, id, 1, png(), { stepKey: stepKeys[1]! }).expect(201);
    const content = sampleContent();
    const current = (await operator.get(`/api/procedures/${id}/revisions/1`).expect(200)).body as RevisionDto;
    // Save the same steps with their keys, minus the second one.
    const phases = current.phases.map((ph, i) => ({
      key: ph.key,
      name: ph.name,
      steps: content.phases[i]!.steps.map((s, j) => ({ ...s, key: ph.steps[j]!.key })).filter((s) => s.key !== stepKeys[1]),
    }));
    const saved = (await put(conductor, `/api/procedures/${id}/revisions/1`, { phases }).expect(200)).body as RevisionDto;
    expect(saved.attachments).toHaveLength(1);
    expect(saved.attachments[0]).toMatchObject({ stepKey: stepKeys[1], stepRemoved: true });
  });
});

describe('reading attachment files', () => {
  it("another team's user cannot read the file or the revision", async () => {
    const { id } = await draftWithSteps();
    const res = (await attach(conductor, id, 1, png()).expect(201)).body as RevisionDto;
    const url = res.attachments[0]!.file.url;
    await operator.agent.get(url).expect(200);
    await outsider.agent.get(url).expect(404);
    await outsider.get(`/api/procedures/${id}/revisions/1`).expect(404);
  });
});
