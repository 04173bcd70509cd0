import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { hashPassword } from '../../server/auth/passwords';
import { Hazard, MitigationEvidence, Team, Upload, User } from '../../server/models';
import { UPLOAD_MAX_BYTES } from '../../src/contract/uploads';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { makePng } from '../helpers/png';

let t: TestApp;
let safety: TestClient;
let admin: TestClient;
let operator: TestClient;
let auditor: TestClient;
let outsider: TestClient;
// The data folder sits under a dot-directory, as the browser suite's e2e/.data does: serving must still work.
const dotDataDir = mkdtempSync(path.join(tmpdir(), 'holdfire-evidence-'));
beforeAll(async () => {
  t = await startTestApp({ env: { HOLDFIRE_DATA_DIR: path.join(dotDataDir, '.data'), DATABASE_URL: `sqlite:${path.join(dotDataDir, '.data', 'holdfire.sqlite')}` } });
  [safety, admin, operator, auditor] = await Promise.all([
    t.client('safety@ternvalley.test'),
    t.client('admin@ternvalley.test'),
    t.client('propellants@ternvalley.test'),
    t.client('auditor@ternvalley.test'),
  ]);
  // A second, invented team: its people must not reach the first team's files.
  const other = await Team.create({ name: 'Heron Flats Propulsion Club', site: 'Heron Flats' });
  await User.create({
    teamId: other.id,
    email: 'safety@heronflats.test',
    name: 'Outside Safety',
    passwordHash: await hashPassword('heron-flats-demo', 4),
    roles: ['safety', 'admin'],
    active: true,
  });
  outsider = await t.client('safety@heronflats.test', 'heron-flats-demo');
});
afterAll(async () => {
  await t.stop();
  rmSync(dotDataDir, { recursive: true, force: true });
});
afterEach(() => vi.restoreAllMocks());

const PNG = makePng();
const dataDir = () => t.holdfire.config.dataDir;
const uploadsDir = () => path.join(dataDir(), 'uploads');
const storedFiles = () => readdirSync(uploadsDir()).sort();

interface Mit {
  id: number;
  evidence: { id: number; kind: string; label: string; data: Record<string, unknown>; addedBy: string | null; file: null | { id: number; name: string; mediaType: string; sizeBytes: number; sha256: string; url: string } }[];
}

async function newHazard(): Promise<{ id: number; mitigationId: number }> {
  const h = await safety
    .post('/api/hazards', { title: 'Test hazard: burst disc fitment', system: 'feed-system', phase: 'assembly', initialSeverity: 2, initialLikelihood: 'C' })
    .expect(201);
  const withMit = await safety
    .post(`/api/hazards/${h.body.id}/mitigations`, { kind: 'engineered-feature', description: 'Burst disc on the fuel manifold', owner: 'Aiko Brennan' })
    .expect(201);
  return { id: h.body.id, mitigationId: withMit.body.mitigations[0].id };
}

function upload(c: TestClient, hazardId: number, mitigationId: number, file?: { bytes: Buffer; name: string; type: string }, label?: string) {
  let req = c.agent.post(`/api/hazards/${hazardId}/mitigations/${mitigationId}/evidence/files`).set('X-CSRF-Token', c.csrf);
  if (label !== undefined) req = req.field('label', label);
  if (file) req = req.attach('file', file.bytes, { filename: file.name, contentType: file.type });
  return req;
}

const del = (c: TestClient, url: string) => c.agent.delete(url).set('X-CSRF-Token', c.csrf);

function mitigationOf(body: { mitigations: Mit[] }, id: number): Mit {
  return body.mitigations.find((m) => m.id === id)!;
}

async function evidenceCount(): Promise<number> {
  return MitigationEvidence.count();
}

/** Runs `fn` and checks that it stored nothing: no file on disk, no upload row, no evidence row. */
async function storesNothing(fn: () => Promise<unknown>) {
  const files = storedFiles();
  const uploads = await Upload.count();
  const evidence = await evidenceCount();
  await fn();
  expect(storedFiles()).toEqual(files);
  expect(await Upload.count()).toBe(uploads);
  expect(await evidenceCount()).toBe(evidence);
}

describe('file evidence on a mitigation', () => {
  it('stores a photo under a random name and serves the same bytes to a reader of the team', async () => {
    const { id, mitigationId } = await newHazard();
    const res = await upload(safety, id, mitigationId, { bytes: PNG, name: 'burst disc fitted.png', type: 'image/png' }, 'Burst disc fitted, serial visible').expect(201);
    const ev = mitigationOf(res.body, mitigationId).evidence[0]!;
    expect(ev).toMatchObject({
      kind: 'file',
      label: 'Burst disc fitted, serial visible',
      addedBy: 'Priya Halloran',
      file: { name: 'burst disc fitted.png', mediaType: 'image/png', sizeBytes: PNG.length, sha256: createHash('sha256').update(PNG).digest('hex') },
    });
    expect(ev.file!.url).toBe(`/api/uploads/${ev.file!.id}`);

    const row = await Upload.findByPk(ev.file!.id);
    expect(row!.storedName).toMatch(/^[0-9a-f]{32}\.png$/);
    expect(readFileSync(path.join(uploadsDir(), row!.storedName)).equals(PNG)).toBe(true);

    // An auditor (reader) downloads it: byte-identical, with the sniffed type and safe headers.
    const dl = await auditor.agent.get(ev.file!.url).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(dl.status).toBe(200);
    expect((dl.body as Buffer).equals(PNG)).toBe(true);
    expect(dl.headers['content-type']).toBe('image/png');
    expect(dl.headers['x-content-type-options']).toBe('nosniff');
    expect(dl.headers['content-disposition']).toBe('inline; filename="burst disc fitted.png"');
    expect(dl.headers['cache-control']).toBe('private, no-cache');
    expect(dl.headers['content-security-policy']).toContain("default-src 'none'");
    // The operator reads it too.
    await operator.get(ev.file!.url).expect(200);
  });

  it('without a label, the evidence is labelled with the file name; the history records the upload', async () => {
    const { id, mitigationId } = await newHazard();
    const res = await upload(admin, id, mitigationId, { bytes: PNG, name: 'manifold.png', type: 'image/png' }).expect(201);
    const ev = mitigationOf(res.body, mitigationId).evidence[0]!;
    expect(ev.label).toBe('manifold.png');
    const history = (await auditor.get(`/api/hazards/${id}/history`).expect(200)).body as { field: string; userName: string; before: unknown; after: Record<string, unknown> }[];
    const line = history.find((h) => h.field === `mitigation:${mitigationId}.evidence`);
    expect(line).toMatchObject({ userName: 'Ines Okafor', before: null, after: { id: ev.id, kind: 'file', name: 'manifold.png', mediaType: 'image/png', sizeBytes: PNG.length, sha256: ev.file!.sha256 } });
  });

  it('serves a PDF inline and CSV text as an attachment with an RFC 5987 name', async () => {
    const { id, mitigationId } = await newHazard();
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n');
    const csv = Buffer.from('t_s,p_manifold_bar\n0.00,1.2\n0.04,31.7\n', 'utf8');
    await upload(safety, id, mitigationId, { bytes: pdf, name: 'proof test.pdf', type: 'application/pdf' }).expect(201);
    const res = await upload(safety, id, mitigationId, { bytes: csv, name: 'Kaltfluss-Prüfung.csv', type: 'text/csv' }).expect(201);
    const [pdfEv, csvEv] = mitigationOf(res.body, mitigationId).evidence;
    expect(pdfEv!.file!.mediaType).toBe('application/pdf');
    expect(csvEv!.file!.mediaType).toBe('text/csv');
    expect(csvEv!.file!.name).toBe('Kaltfluss-Prüfung.csv');

    const p = await auditor.get(pdfEv!.file!.url).expect(200);
    expect(p.headers['content-type']).toBe('application/pdf');
    expect(p.headers['content-disposition']).toBe('inline; filename="proof test.pdf"');
    const c = await auditor.get(csvEv!.file!.url).expect(200);
    expect(c.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(c.headers['content-disposition']).toBe(`attachment; filename="Kaltfluss-Pr?fung.csv"; filename*=UTF-8''Kaltfluss-Pr%C3%BCfung.csv`);
    expect(c.text).toBe(csv.toString('utf8'));
  });

  it('names the download by the type the bytes are, whatever extension was sent', async () => {
    const { id, mitigationId } = await newHazard();
    const res = await upload(safety, id, mitigationId, { bytes: PNG, name: 'scan.pdf', type: 'application/pdf' }).expect(201);
    const ev = mitigationOf(res.body, mitigationId).evidence[0]!;
    expect(ev.file).toMatchObject({ name: 'scan.pdf.png', mediaType: 'image/png' });
  });

  it('never uses the sent name as a path', async () => {
    const { id, mitigationId } = await newHazard();
    const before = storedFiles();
    const res = await upload(safety, id, mitigationId, { bytes: PNG, name: '../../x.png', type: 'image/png' }).expect(201);
    const ev = mitigationOf(res.body, mitigationId).evidence[0]!;
    expect(ev.file!.name).toBe('x.png');
    const added = storedFiles().filter((f) => !before.includes(f));
    expect(added).toHaveLength(1);
    expect(added[0]).toMatch(/^[0-9a-f]{32}\.png$/);
    expect(added[0]).not.toContain('x.png');
    expect(existsSync(path.join(dataDir(), 'x.png'))).toBe(false);
    expect(existsSync(path.join(dataDir(), '..', 'x.png'))).toBe(false);
    expect(existsSync(path.join(uploadsDir(), '..', '..', 'x.png'))).toBe(false);
    const dl = await safety.get(ev.file!.url).expect(200);
    expect(dl.headers['content-disposition']).toBe('inline; filename=x.png');
  });

  it('refuses a file over 10 MB with 413 and keeps nothing', async () => {
    const { id, mitigationId } = await newHazard();
    const big = Buffer.concat([PNG, Buffer.alloc(UPLOAD_MAX_BYTES + 1 - PNG.length)]);
    await storesNothing(async () => {
      const res = await upload(safety, id, mitigationId, { bytes: big, name: 'huge.png', type: 'image/png' }).expect(413);
      expect(res.body).toMatchObject({ code: 'file_too_large', error: expect.stringContaining('10 MB') });
    });
    // Exactly at the limit is accepted.
    const atLimit = Buffer.concat([PNG, Buffer.alloc(UPLOAD_MAX_BYTES - PNG.length)]);
    await upload(safety, id, mitigationId, { bytes: atLimit, name: 'limit.png', type: 'image/png' }).expect(201);
  });

  it.each([
    ['HTML named .png, declared image/png', Buffer.from('<!doctype html><script>alert(document.cookie)</script>'), 'photo.png', 'image/png'],
    ['a Windows executable named .png', Buffer.concat([Buffer.from('MZ'), Buffer.alloc(58), Buffer.from([0x80, 0, 0, 0]), Buffer.alloc(64), Buffer.from('PE\0\0'), Buffer.alloc(200)]), 'photo.png', 'image/png'],
    ['an ELF executable named .jpg', Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(120)]), 'photo.jpg', 'image/jpeg'],
    ['SVG (can carry script)', Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), 'drawing.svg', 'image/svg+xml'],
    ['HTML named .txt', Buffer.from('  <html><body>hi</body></html>'), 'notes.txt', 'text/plain'],
    ['text with a NUL byte named .txt', Buffer.from('pressure\0log'), 'log.txt', 'text/plain'],
    ['invalid UTF-8 named .csv', Buffer.from([0x61, 0x2c, 0xff, 0xfe, 0x0a]), 'data.csv', 'text/csv'],
    ['plain text named .png', Buffer.from('just some words'), 'words.png', 'image/png'],
    ['a ZIP named .pdf', Buffer.concat([Buffer.from([0x50, 0x4b, 0x03, 0x04]), Buffer.alloc(60)]), 'report.pdf', 'application/pdf'],
  ])('refuses %s with 415 and keeps nothing', async (_name, bytes, name, type) => {
    const { id, mitigationId } = await newHazard();
    await storesNothing(async () => {
      const res = await upload(safety, id, mitigationId, { bytes, name, type }).expect(415);
      expect(res.body).toMatchObject({ code: 'file_type_not_allowed', error: expect.stringContaining('read from the file') });
    });
  });

  it('answers 400 with no file, an empty file, the wrong field or two files, and keeps nothing', async () => {
    const { id, mitigationId } = await newHazard();
    const url = `/api/hazards/${id}/mitigations/${mitigationId}/evidence/files`;
    await storesNothing(async () => {
      expect((await upload(safety, id, mitigationId, undefined, 'label only').expect(400)).body.code).toBe('file_required');
      expect((await safety.post(url, { label: 'json, not multipart' }).expect(400)).body.code).toBe('file_required');
      expect((await upload(safety, id, mitigationId, { bytes: Buffer.alloc(0), name: 'empty.png', type: 'image/png' }).expect(400)).body.code).toBe('file_empty');
      const wrongField = await safety.agent.post(url).set('X-CSRF-Token', safety.csrf).attach('photo', PNG, { filename: 'a.png', contentType: 'image/png' }).expect(400);
      expect(wrongField.body).toMatchObject({ code: 'unexpected_file', error: "Send one file, in the form field 'file'." });
      const two = await safety.agent
        .post(url)
        .set('X-CSRF-Token', safety.csrf)
        .attach('file', PNG, { filename: 'a.png', contentType: 'image/png' })
        .attach('file', PNG, { filename: 'b.png', contentType: 'image/png' })
        .expect(400);
      expect(two.body.code).toBe('unexpected_file');
      const longLabel = await upload(safety, id, mitigationId, { bytes: PNG, name: 'a.png', type: 'image/png' }, 'x'.repeat(201)).expect(400);
      expect(longLabel.body.details).toEqual([{ path: 'label', message: 'Use at most 200 characters' }]);
      const extra = await safety.agent.post(url).set('X-CSRF-Token', safety.csrf).field('owner', 'x').attach('file', PNG, { filename: 'a.png', contentType: 'image/png' }).expect(400);
      expect(extra.body.code).toBe('validation_failed');
      const broken = await safety.agent
        .post(url)
        .set('X-CSRF-Token', safety.csrf)
        .set('Content-Type', 'multipart/form-data; boundary=xyz')
        .send('--xyz\r\nContent-Disposition: form-data; name="file"; filename="a.png"\r\n\r\n\x89PNG cut off');
      expect(broken.status).toBe(400);
      expect(broken.body.code).toBe('bad_upload');
    });
  });

  it('refuses people without the safety or admin role, signed-out callers and a missing CSRF token', async () => {
    const { id, mitigationId } = await newHazard();
    const file = { bytes: PNG, name: 'a.png', type: 'image/png' };
    await storesNothing(async () => {
      expect((await upload(operator, id, mitigationId, file).expect(403)).body.code).toBe('forbidden');
      expect((await upload(auditor, id, mitigationId, file).expect(403)).body.code).toBe('forbidden');
      const anon = await t.client();
      expect((await upload(anon, id, mitigationId, file).expect(401)).body.code).toBe('unauthenticated');
      const noToken = await safety.agent.post(`/api/hazards/${id}/mitigations/${mitigationId}/evidence/files`).attach('file', PNG, { filename: 'a.png', contentType: 'image/png' });
      expect(noToken.status).toBe(403);
      expect(noToken.body.code).toBe('csrf_invalid');
    });
  });

  it('refuses a closed hazard, an unknown mitigation and another team, and keeps nothing', async () => {
    const { id, mitigationId } = await newHazard();
    const other = await newHazard();
    const file = { bytes: PNG, name: 'a.png', type: 'image/png' };
    await storesNothing(async () => {
      expect((await upload(safety, id, other.mitigationId, file).expect(404)).body.error).toBe('No such mitigation on this hazard.');
      expect((await upload(safety, 999999, mitigationId, file).expect(404)).body.error).toBe('No such hazard.');
      expect((await upload(outsider, id, mitigationId, file).expect(404)).body.error).toBe('No such hazard.');
      await Hazard.update({ status: 'closed' }, { where: { id } });
      expect((await upload(safety, id, mitigationId, file).expect(409)).body.code).toBe('hazard_closed');
    });
    await Hazard.update({ status: 'open' }, { where: { id } });
  });

  it('deletes the written file again when saving the evidence fails', async () => {
    const { id, mitigationId } = await newHazard();
    const historyBefore = (await safety.get(`/api/hazards/${id}/history`).expect(200)).body.length;
    vi.spyOn(MitigationEvidence, 'create').mockRejectedValueOnce(new Error('simulated database failure'));
    await storesNothing(async () => {
      const res = await upload(safety, id, mitigationId, { bytes: PNG, name: 'a.png', type: 'image/png' });
      expect(res.status).toBe(500);
      expect(res.body.code).toBe('internal');
    });
    expect((await safety.get(`/api/hazards/${id}/history`).expect(200)).body.length).toBe(historyBefore);
  });
});

describe('downloading a file', () => {
  it('is for signed-in people of the same team only', async () => {
    const { id, mitigationId } = await newHazard();
    const res = await upload(safety, id, mitigationId, { bytes: PNG, name: 'a.png', type: 'image/png' }).expect(201);
    const url = mitigationOf(res.body, mitigationId).evidence[0]!.file!.url;
    const anon = await request(t.holdfire.app).get(url).expect(401);
    expect(anon.body.code).toBe('unauthenticated');
    const foreign = await outsider.get(url).expect(404);
    expect(foreign.body).toEqual({ error: 'No such file.', code: 'not_found' });
    expect(foreign.headers['content-type']).toMatch(/application\/json/);
    await safety.get('/api/uploads/999999').expect(404);
    await safety.get('/api/uploads/abc').expect(400);
  });

  it('answers 404 in JSON when the file has gone from the disk', async () => {
    const { id, mitigationId } = await newHazard();
    const res = await upload(safety, id, mitigationId, { bytes: PNG, name: 'a.png', type: 'image/png' }).expect(201);
    const file = mitigationOf(res.body, mitigationId).evidence[0]!.file!;
    const row = await Upload.findByPk(file.id);
    rmSync(path.join(uploadsDir(), row!.storedName));
    const gone = await auditor.get(file.url).expect(404);
    expect(gone.headers['content-type']).toMatch(/application\/json/);
    expect(gone.headers['content-disposition']).toBeUndefined();
    expect(gone.body.error).toMatch(/missing from storage/);
  });
});

describe('removing evidence', () => {
  it('removes file evidence with its file, and the history keeps what it was', async () => {
    const { id, mitigationId } = await newHazard();
    const up = await upload(safety, id, mitigationId, { bytes: PNG, name: 'to-remove.png', type: 'image/png' }, 'Wrong photo').expect(201);
    const ev = mitigationOf(up.body, mitigationId).evidence[0]!;
    const row = (await Upload.findByPk(ev.file!.id))!;
    const onDisk = path.join(uploadsDir(), row.storedName);
    expect(existsSync(onDisk)).toBe(true);

    await del(operator, `/api/hazards/${id}/evidence/${ev.id}`).expect(403);
    await del(auditor, `/api/hazards/${id}/evidence/${ev.id}`).expect(403);
    const other = await newHazard();
    expect((await del(safety, `/api/hazards/${other.id}/evidence/${ev.id}`).expect(404)).body.error).toBe('No such evidence on this hazard.');
    expect(existsSync(onDisk)).toBe(true);

    const res = await del(safety, `/api/hazards/${id}/evidence/${ev.id}`).expect(200);
    expect(mitigationOf(res.body, mitigationId).evidence).toEqual([]);
    expect(existsSync(onDisk)).toBe(false);
    expect(await Upload.findByPk(ev.file!.id)).toBeNull();
    await auditor.get(ev.file!.url).expect(404);

    const history = (await auditor.get(`/api/hazards/${id}/history`).expect(200)).body as { field: string; before: unknown; after: unknown }[];
    const removal = history.filter((h) => h.field === `mitigation:${mitigationId}.evidence`).at(-1);
    expect(removal).toMatchObject({ before: { id: ev.id, kind: 'file', label: 'Wrong photo', name: 'to-remove.png', sha256: ev.file!.sha256 }, after: null });
    await del(safety, `/api/hazards/${id}/evidence/${ev.id}`).expect(404);
  });

  it('removes frozen calc evidence and refuses on a closed hazard', async () => {
    const { id, mitigationId } = await newHazard();
    const calc = await safety.post(`/api/hazards/${id}/evidence`, { mitigationId, calc: 'surge', inputs: { fluid: 'ethanol', velocityChangeMps: 2.2 } }).expect(201);
    const ev = mitigationOf(calc.body, mitigationId).evidence[0]!;
    expect(ev).toMatchObject({ kind: 'calc', file: null, addedBy: 'Priya Halloran', data: { calc: 'surge', inputs: { fluid: 'ethanol', velocityChangeMps: 2.2 } } });
    await Hazard.update({ status: 'closed' }, { where: { id } });
    expect((await del(safety, `/api/hazards/${id}/evidence/${ev.id}`).expect(409)).body.code).toBe('hazard_closed');
    await Hazard.update({ status: 'open' }, { where: { id } });
    const res = await del(admin, `/api/hazards/${id}/evidence/${ev.id}`).expect(200);
    expect(mitigationOf(res.body, mitigationId).evidence).toEqual([]);
    const history = (await auditor.get(`/api/hazards/${id}/history`).expect(200)).body as { field: string; before: unknown; after: unknown }[];
    expect(history.at(-1)).toMatchObject({ field: `mitigation:${mitigationId}.evidence`, before: { id: ev.id, kind: 'calc', calc: 'surge' }, after: null });
  });

  it('removing a mitigation removes the files of its evidence', async () => {
    const { id, mitigationId } = await newHazard();
    const up = await upload(safety, id, mitigationId, { bytes: PNG, name: 'a.png', type: 'image/png' }).expect(201);
    const file = mitigationOf(up.body, mitigationId).evidence[0]!.file!;
    const onDisk = path.join(uploadsDir(), (await Upload.findByPk(file.id))!.storedName);
    await del(safety, `/api/hazards/${id}/mitigations/${mitigationId}`).expect(200);
    expect(existsSync(onDisk)).toBe(false);
    expect(await Upload.findByPk(file.id)).toBeNull();
  });
});
