import { readdirSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '../../server/auth/passwords';
import { CountEvent, SensorDataset, Team, Upload, User } from '../../server/models';
import { seedDemoSensorData, KESTREL_LIMITS } from '../../server/db/seed-sensors';
import type { SensorDataDto, SensorDatasetDto, SensorListDto } from '../../src/contract/sensors';
import { UPLOAD_MAX_BYTES } from '../../src/contract/uploads';
import { createUploadStore } from '../../server/uploads';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';
import { releasedShortProcedure, releasedTinyProcedure } from '../helpers/counts';

// Sensor data for a count (docs/sensor-data.md): upload, refusals, access, decimation, limits, removal.
let t: TestApp;
let conductor: TestClient;
let safety: TestClient;
let data: TestClient;
let auditor: TestClient;
let admin: TestClient;
let outsider: TestClient;
/** A count that never reached T-0, and one that did. */
let waiting: number;
let fired: number;
let t0At: number;

async function until(check: () => Promise<boolean>, ms = 15_000) {
  const end = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 50));
  }
}

beforeAll(async () => {
  t = await startTestApp();
  [conductor, safety, data, auditor, admin] = await Promise.all([DEMO.conductor, DEMO.safety, DEMO.data, DEMO.auditor, DEMO.admin].map((e) => t.client(e)));
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

  const short = await releasedShortProcedure(conductor, safety, `Sensors waiting ${Date.now()}`);
  waiting = (await conductor.post('/api/counts', { ...short, name: 'Never fired' }).expect(201)).body.id;
  const tiny = await releasedTinyProcedure(conductor, safety, `Sensors fired ${Date.now()}`);
  fired = (await conductor.post('/api/counts', { ...tiny, name: 'Fired' }).expect(201)).body.id;
  await conductor.post(`/api/counts/${fired}/commands`, { type: 'count:start', fromSeconds: -1 }).expect(200);
  await until(async () => (await auditor.get(`/api/counts/${fired}/state`).expect(200)).body.t0At !== null);
  t0At = (await auditor.get(`/api/counts/${fired}/state`).expect(200)).body.t0At;
}, 60_000);
afterAll(() => t.stop());

const uploadsDir = () => path.join(t.holdfire.config.dataDir, 'uploads');
const storedFiles = () => readdirSync(uploadsDir()).sort();

function upload(c: TestClient, countId: number, text: string | Buffer, name = 'run.csv', fields: Record<string, string> = {}) {
  let req = c.agent.post(`/api/counts/${countId}/sensors`).set('X-CSRF-Token', c.csrf);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', typeof text === 'string' ? Buffer.from(text) : text, { filename: name, contentType: 'text/csv' });
}
const del = (c: TestClient, url: string) => c.agent.delete(url).set('X-CSRF-Token', c.csrf);

async function storesNothing(fn: () => Promise<unknown>) {
  const files = storedFiles();
  const [uploads, datasets] = [await Upload.count(), await SensorDataset.count()];
  await fn();
  expect(storedFiles()).toEqual(files);
  expect(await Upload.count()).toBe(uploads);
  expect(await SensorDataset.count()).toBe(datasets);
}

const SMALL = 't_s,chamber_pressure (bar),thrust (kN)\n-1,0,0\n0,2,0.5\n0.5,16,2.1\n1,15,2\n1.5,,2\n';

describe('uploading a CSV', () => {
  it('stores seconds from T-0 with units and limits, keeps the original file, and lists it for every signed-in role', async () => {
    const res = await upload(data, waiting, SMALL, 'hot fire 1.csv', { limits: JSON.stringify({ chamber_pressure: { high: 15.5 } }) }).expect(201);
    const d = res.body as SensorDatasetDto;
    expect(d).toMatchObject({
      countId: waiting,
      timeBase: 'seconds',
      timeColumn: 't_s',
      rows: 5,
      tStart: -1,
      tEnd: 1.5,
      channels: [
        { index: 0, name: 'chamber_pressure', unit: 'bar', low: null, high: 15.5 },
        { index: 1, name: 'thrust', unit: 'kN', low: null, high: null },
      ],
      uploadedBy: { name: 'Noor Fairweather' },
      file: { name: 'hot fire 1.csv', sizeBytes: SMALL.length },
    });
    const original = await auditor.get(d.file.url).buffer(true).parse((r, cb) => {
      let body = '';
      r.on('data', (c: Buffer) => (body += c.toString()));
      r.on('end', () => cb(null, body));
    });
    expect(original.body).toBe(SMALL);
    // Packed columns, not a row per sample: time plus 2 channels, 5 rows, 8 bytes each.
    const row = await SensorDataset.findByPk(d.id);
    expect(row!.data.length).toBe(3 * 5 * 8);

    const list = (await auditor.get(`/api/counts/${waiting}/sensors`).expect(200)).body as SensorListDto;
    expect(list.datasets.map((x) => x.id)).toContain(d.id);
    expect(list.timeline.t0At).toBeNull();

    const full = (await auditor.get(`/api/counts/${waiting}/sensors/${d.id}/data`).expect(200)).body as SensorDataDto;
    expect(full).toMatchObject({ rows: 5, points: 5, decimated: false, t: [-1, 0, 0.5, 1, 1.5] });
    expect(full.values).toEqual([
      [0, 2, 16, 15, null],
      [0, 0.5, 2.1, 2, 2],
    ]);
    // Worked by hand from SMALL: chamber pressure peaks at 16 bar at T+0.5, above 15.5 from 0.5 until 1 (15 is within).
    expect(full.summaries[0]).toMatchObject({ samples: 4, min: 0, tMin: -1, max: 16, tMax: 0.5, excursions: [{ side: 'high', from: 0.5, to: 1, peak: 16, tPeak: 0.5 }] });
  });

  it('converts wall-clock ISO 8601 times with the count’s actual T-0', async () => {
    const iso = (s: number) => new Date(t0At + s * 1000).toISOString();
    const text = `timestamp,lox_tank_pressure (bar)\n${iso(-2)},20\n${iso(-0.25)},21\n${iso(3)},19.5\n`;
    const d = (await upload(conductor, fired, text).expect(201)).body as SensorDatasetDto;
    expect(d).toMatchObject({ timeBase: 'wallclock', timeColumn: 'timestamp', tStart: -2, tEnd: 3, rows: 3 });
    const full = (await auditor.get(`/api/counts/${fired}/sensors/${d.id}/data`).expect(200)).body as SensorDataDto;
    expect(full.t).toEqual([-2, -0.25, 3]);
    const list = (await auditor.get(`/api/counts/${fired}/sensors`).expect(200)).body as SensorListDto;
    expect(list.timeline.t0At).toBe(t0At);
  });

  it('refuses wall-clock times on a count that never reached T-0, and stores nothing', async () => {
    await storesNothing(async () => {
      const res = await upload(conductor, waiting, 'timestamp,p (bar)\n2026-05-17T14:30:00Z,1\n').expect(409);
      expect(res.body.code).toBe('sensor_no_t0');
      expect(res.body.error).toContain('never reached T-0');
    });
  });

  it('refuses bad files with the row and column named, storing nothing', async () => {
    const cases: [string, number, string, RegExp][] = [
      ['p (bar),q\n1,2\n', 400, 'sensor_no_time_column', /Row 1 \(the header\) has no time column/],
      ['t_s,p (bar)\n0,1\n0.01,abc\n', 400, 'sensor_not_a_number', /Row 3, column 2 \(“p \(bar\)”\): “abc” is not a number/],
      ['t_s,p\n0,1\n0.02,1\n0.01,1\n', 400, 'sensor_time_not_increasing', /Row 4, column 1 \(“t_s”\)/],
      ['t_s,p\n0,1\n1,2,3\n', 400, 'sensor_bad_row', /Row 3 has 3 cells; the header has 2/],
      [`t_s,${Array.from({ length: 17 }, (_, i) => `c${i}`).join(',')}\n`, 400, 'sensor_too_many_columns', /17 channels|18 columns/],
      ['t_s,p\n', 400, 'sensor_no_rows', /no data rows/],
      ['\n\n', 400, 'sensor_file_empty', /no rows/],
    ];
    for (const [text, status, code, message] of cases) {
      await storesNothing(async () => {
        const res = await upload(data, waiting, text).expect(status);
        expect(res.body.code, text).toBe(code);
        expect(res.body.error).toMatch(message);
      });
    }
    await storesNothing(async () => {
      expect((await upload(data, waiting, '').expect(400)).body.code).toBe('file_empty');
      const limits = await upload(data, waiting, SMALL, 'a.csv', { limits: JSON.stringify({ chamber_presure: { high: 3 } }) }).expect(400);
      expect(limits.body.error).toContain('“chamber_presure”, which is not a channel');
      const crossed = await upload(data, waiting, SMALL, 'a.csv', { limits: JSON.stringify({ thrust: { low: 3, high: 2 } }) }).expect(400);
      expect(crossed.body.details[0].message).toBe('The high limit must be above the low limit');
      const png = Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex');
      await upload(data, waiting, png, 'plot.png').expect(415);
    });
  });

  it('answers 413 for more rows than allowed and for a file over the upload limit', async () => {
    const rows = ['t_s,p'];
    for (let i = 0; i <= 200_000; i++) rows.push(`${i},1`);
    await storesNothing(async () => {
      const res = await upload(data, waiting, rows.join('\n')).expect(413);
      expect(res.body.code).toBe('sensor_too_many_rows');
      expect(res.body.error).toContain('row 200002 is one too many');
      const huge = Buffer.alloc(UPLOAD_MAX_BYTES + 1, 'a');
      expect((await upload(data, waiting, huge).expect(413)).body.code).toBe('file_too_large');
    });
  });

  it('lets conductor, safety, admin and operators write; the auditor and other teams may not', async () => {
    for (const c of [conductor, safety, admin]) await upload(c, waiting, SMALL).expect(201);
    await storesNothing(async () => {
      await upload(auditor, waiting, SMALL).expect(403);
      await upload(outsider, waiting, SMALL).expect(404);
      await outsider.get(`/api/counts/${waiting}/sensors`).expect(404);
    });
    const anon = await t.client();
    await anon.get(`/api/counts/${waiting}/sensors`).expect(401);
  });
});

describe('reading the data', () => {
  it('decimates 100,000 rows with min and max per bucket (worked cases in tests/domain/sensors.test.ts); maxPoints is checked', async () => {
    const text = 't_s,v\n' + Array.from({ length: 10 }, (_, i) => `${i / 10},${i}`).join('\n');
    const d = (await upload(data, waiting, text).expect(201)).body as SensorDatasetDto;
    expect((await auditor.get(`/api/counts/${waiting}/sensors/${d.id}/data?maxPoints=3`).expect(400)).body.details[0].path).toBe('maxPoints');
    await auditor.get(`/api/counts/${waiting}/sensors/${d.id}/data?maxPoints=many`).expect(400);
    // Fewer rows than maxPoints come back whole.
    const whole = (await auditor.get(`/api/counts/${waiting}/sensors/${d.id}/data?maxPoints=10`).expect(200)).body as SensorDataDto;
    expect(whole).toMatchObject({ decimated: false, points: 10 });
    const rows = ['t_s,v'];
    for (let i = 0; i < 100_000; i++) rows.push(`${i / 100},${i === 73_210 ? 99 : i === 12_345 ? -99 : i % 7}`);
    const big = (await upload(data, waiting, rows.join('\n')).expect(201)).body as SensorDatasetDto;
    const dec = (await auditor.get(`/api/counts/${waiting}/sensors/${big.id}/data?maxPoints=1000`).expect(200)).body as SensorDataDto;
    expect(dec).toMatchObject({ rows: 100_000, points: 1000, decimated: true });
    // The one spike up and the one spike down survive decimation; the summary comes from every row.
    expect(Math.max(...(dec.values[0] as number[]))).toBe(99);
    expect(Math.min(...(dec.values[0] as number[]))).toBe(-99);
    expect(dec.summaries[0]).toMatchObject({ max: 99, tMax: 732.1, min: -99, tMin: 123.45 });
    // Bucket 0 of 500 covers rows 0..199 (times 0..1.99): values i % 7 give min 0 and max 6, row 0 before row 6.
    expect(dec.t.slice(0, 2)).toEqual([0, 1.99]);
    expect(dec.values[0]!.slice(0, 2)).toEqual([0, 6]);
    // A zoomed view: 100.005..100.1 s holds rows 10001..10010 (t = i / 100), plus rows 10000 and 10011 -> 12 rows,
    // under maxPoints so not decimated; the summaries still cover every row.
    const view = (await auditor.get(`/api/counts/${waiting}/sensors/${big.id}/data?maxPoints=1000&from=100.005&to=100.1`).expect(200)).body as SensorDataDto;
    expect(view).toMatchObject({ points: 12, decimated: false, window: { from: 100.005, to: 100.1 } });
    expect(view.t[0]).toBe(100);
    expect(view.t.at(-1)).toBe(100.11);
    expect(view.values[0]!.slice(0, 3)).toEqual([10000 % 7, 10001 % 7, 10002 % 7]);
    expect(view.summaries[0]).toMatchObject({ max: 99, min: -99 });
    const bad = await auditor.get(`/api/counts/${waiting}/sensors/${big.id}/data?from=5&to=1`).expect(400);
    expect(bad.body.details[0]).toMatchObject({ path: 'to', message: 'The end must be after the start' });
    await auditor.get(`/api/counts/${waiting}/sensors/${big.id}/data?from=soon`).expect(400);
  });
});

describe('limits and removal', () => {
  it('edits limits and units afterwards; the summary follows; bad limits are 400 and change nothing', async () => {
    const d = (await upload(data, waiting, SMALL).expect(201)).body as SensorDatasetDto;
    const patched = (await data.patch(`/api/counts/${waiting}/sensors/${d.id}`, { channels: [{ index: 1, low: 1, high: 2.05, unit: 'kN' }] }).expect(200)).body as SensorDatasetDto;
    expect(patched.channels[1]).toMatchObject({ low: 1, high: 2.05 });
    const full = (await auditor.get(`/api/counts/${waiting}/sensors/${d.id}/data`).expect(200)).body as SensorDataDto;
    // Thrust 0, 0.5, 2.1, 2, 2: below 1 from -1 until 0.5, where it jumps above 2.05 until 1.
    expect(full.summaries[1]!.excursions).toEqual([
      { side: 'low', from: -1, to: 0.5, peak: 0, tPeak: -1 },
      { side: 'high', from: 0.5, to: 1, peak: 2.1, tPeak: 0.5 },
    ]);
    const bad = await data.patch(`/api/counts/${waiting}/sensors/${d.id}`, { channels: [{ index: 1, high: 0.5 }] }).expect(400);
    expect(bad.body.details[0]).toEqual({ path: 'channels.0.high', message: 'For thrust, the high limit must be above the low limit (1).' });
    await data.patch(`/api/counts/${waiting}/sensors/${d.id}`, { channels: [{ index: 5, high: 1 }] }).expect(400);
    await auditor.patch(`/api/counts/${waiting}/sensors/${d.id}`, { channels: [{ index: 0, high: 1 }] }).expect(403);
    const after = (await auditor.get(`/api/counts/${waiting}/sensors`).expect(200)).body as SensorListDto;
    expect(after.datasets.find((x) => x.id === d.id)!.channels[1]).toMatchObject({ low: 1, high: 2.05 });
  });

  it('removes a dataset and its file; the count log is untouched', async () => {
    const d = (await upload(data, fired, SMALL).expect(201)).body as SensorDatasetDto;
    const eventsBefore = await CountEvent.count({ where: { countId: fired } });
    const verdict = (await auditor.get(`/api/counts/${fired}/verify`).expect(200)).body;
    const files = storedFiles();
    await del(auditor, `/api/counts/${fired}/sensors/${d.id}`).expect(403);
    await del(data, `/api/counts/${fired}/sensors/${d.id}`).expect(204);
    expect(await SensorDataset.findByPk(d.id)).toBeNull();
    expect(await Upload.findByPk(d.file.uploadId)).toBeNull();
    expect(storedFiles()).toHaveLength(files.length - 1);
    await auditor.get(`/api/counts/${fired}/sensors/${d.id}/data`).expect(404);
    await del(data, `/api/counts/${fired}/sensors/${d.id}`).expect(404);
    expect(await CountEvent.count({ where: { countId: fired } })).toBe(eventsBefore);
    expect((await auditor.get(`/api/counts/${fired}/verify`).expect(200)).body).toEqual(verdict);
  });
});

describe('seedDemoSensorData', () => {
  it('stores the invented engine and skid recordings on a count: 100 Hz from T-60 s to T+15 s, the same on every run', async () => {
    const holds = [{ fromT: -50, toT: -44 }];
    const ids = await seedDemoSensorData({ uploads: createUploadStore(t.holdfire.config.dataDir), teamId: 1, countId: fired, t0At, holds });
    expect(ids).toHaveLength(2);
    const list = (await auditor.get(`/api/counts/${fired}/sensors`).expect(200)).body as SensorListDto;
    const [engine, skid] = ids.map((id) => list.datasets.find((d) => d.id === id)!);
    expect(engine).toMatchObject({ timeBase: 'seconds', rows: 7501, tStart: -60, tEnd: 15 });
    expect(engine!.channels.map((c) => [c.name, c.unit, c.high])).toEqual([
      ['chamber_pressure', 'bar', KESTREL_LIMITS.chamber_pressure.high],
      ['thrust', 'kN', KESTREL_LIMITS.thrust.high],
    ]);
    expect(skid).toMatchObject({ timeBase: 'wallclock', rows: 7501, tStart: -60, tEnd: 15 });
    const e = (await auditor.get(`/api/counts/${fired}/sensors/${engine!.id}/data`).expect(200)).body as SensorDataDto;
    // About 15 bar and 2 kN in the steady part of the burn (invented numbers of the demo engine).
    expect(e.summaries[0]!.max).toBeGreaterThan(14.5);
    expect(e.summaries[0]!.max).toBeLessThan(15.5);
    expect(e.summaries[0]!.tMax).toBeGreaterThan(0.3);
    expect(e.summaries[0]!.tMax).toBeLessThan(5);
    expect(e.summaries[1]!.max).toBeCloseTo(2.0, 0);
    const s = (await auditor.get(`/api/counts/${fired}/sensors/${skid!.id}/data`).expect(200)).body as SensorDataDto;
    // The LOX tank overshoots its 27 bar limit once, just after pressurisation (the demo's limit crossing).
    expect(s.summaries[0]!.excursions).toHaveLength(1);
    expect(s.summaries[0]!.excursions[0]!.from).toBeGreaterThan(-32);
    expect(s.summaries[0]!.excursions[0]!.to).toBeLessThan(-30);
    // Deterministic: a second run stores the same bytes.
    const again = await seedDemoSensorData({ uploads: createUploadStore(t.holdfire.config.dataDir), teamId: 1, countId: fired, t0At, holds });
    const after = (await auditor.get(`/api/counts/${fired}/sensors`).expect(200)).body as SensorListDto;
    expect(after.datasets.find((d) => d.id === again[0])!.file.sha256).toBe(engine!.file.sha256);
  });
});
