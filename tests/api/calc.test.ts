import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp, type TestClient } from '../helpers/app';

let t: TestApp;
let op: TestClient;
beforeAll(async () => {
  t = await startTestApp();
  op = await t.client('propellants@ternvalley.test');
});
afterAll(() => t.stop());

const GOVERNING = "The site's governing code and its licensed authority decide";

describe('GET /api/calc/*', () => {
  it('needs a session', async () => {
    const anon = await t.client();
    await anon.get('/api/calc/oxygen?percent=21').expect(401);
  });

  it('risk: MIL-STD-882E Table III cells', async () => {
    // MIL-STD-882E Table III: 2C Serious, 1A High, 4E Low, 3D Medium, 1F Eliminated.
    for (const [sev, lik, level] of [['2', 'C', 'serious'], ['1', 'A', 'high'], ['4', 'E', 'low'], ['3', 'D', 'medium'], ['1', 'F', 'eliminated']]) {
      const res = await op.get(`/api/calc/risk?matrix=mil-std-882e&severity=${sev}&likelihood=${lik}`).expect(200);
      expect(res.body.level).toBe(level);
    }
  });

  it('risk: an unknown severity is a 400 naming the field', async () => {
    const res = await op.get('/api/calc/risk?severity=7&likelihood=C').expect(400);
    expect(res.body.details[0].path).toBe('severity');
  });

  it('propellant mass: LOX 1141 kg/m3 (NIST Chemistry WebBook, oxygen, saturation properties)', async () => {
    const res = await op.get('/api/calc/propellant-mass?propellant=lox&volumeL=40&fillPercent=90').expect(200);
    expect(res.body.densityKgM3).toBe(1141);
    // D: 1141 kg/m3 * 0.040 m3 * 0.90 = 41.076 kg
    expect(res.body.massKg).toBeCloseTo(41.076, 3);
    expect(res.body.source).toMatch(/NIST/);
  });

  it("propellant mass: 75 % ethanol-water 856 kg/m3 (Perry's Chemical Engineers' Handbook)", async () => {
    const res = await op.get('/api/calc/propellant-mass?propellant=ethanol-water&volumeL=10&fillPercent=100&ethanolMassPercent=75').expect(200);
    expect(res.body.densityKgM3).toBeCloseTo(856, 6);
    expect(res.body.massKg).toBeCloseTo(8.56, 6);
  });

  it('propellant mass: a blend without its ethanol content is a 400 on that field', async () => {
    const res = await op.get('/api/calc/propellant-mass?propellant=ethanol-water&volumeL=10&fillPercent=100').expect(400);
    expect(res.body.details).toEqual([expect.objectContaining({ path: 'ethanolMassPercent' })]);
  });

  it('quantity-distance: 10 % static stand, K = 40 ft/lb^(1/3) (DoD 6055.9-STD; NSWC, Swisdak)', async () => {
    const res = await op.get('/api/calc/quantity-distance?propellantKg=100&combination=lox-alcohol&setting=static-test-stand').expect(200);
    // DoD 6055.9-STD: LO2/alcohol on a static test stand, 10 % TNT equivalence -> 10 kg.
    expect(res.body.tntKg).toBeCloseTo(10, 9);
    // D: 40 * 0.3967 m/kg^(1/3) * 10^(1/3) = 34.19 m
    expect(res.body.distancesM.inhabitedBuilding).toBeCloseTo(40 * 0.3967 * Math.cbrt(10), 6);
    expect(res.body.distancesM.publicTrafficRoute).toBeCloseTo(24 * 0.3967 * Math.cbrt(10), 6);
    expect(res.body.distancesM.intralineUnbarricaded).toBeCloseTo(18 * 0.3967 * Math.cbrt(10), 6);
    expect(res.body.distancesM.intralineBarricaded).toBeCloseTo(9 * 0.3967 * Math.cbrt(10), 6);
    expect(res.body.cautions.join(' ')).toContain(GOVERNING);
  });

  it('quantity-distance: an unlisted combination without tntPercent is a 400, never a default', async () => {
    const res = await op.get('/api/calc/quantity-distance?propellantKg=100&combination=n2o-ethanol&setting=static-test-stand').expect(400);
    expect(res.body.details[0].path).toBe('combination');
    const ok = await op.get('/api/calc/quantity-distance?propellantKg=100&combination=n2o-ethanol&tntPercent=20').expect(200);
    expect(ok.body.tntKg).toBeCloseTo(20, 9);
    expect(ok.body.cautions.length).toBe(2);
  });

  it('surge: Joukowsky, water dv 1 m/s -> 1.480 MPa (Wylie & Streeter; Kaye & Laby c = 1482.3 m/s)', async () => {
    const res = await op.get('/api/calc/surge?densityKgM3=998.2&waveSpeedMps=1482.3&velocityChangeMps=1').expect(200);
    expect(res.body.deltaPressurePa / 1e6).toBeCloseTo(1.48, 3);
    expect(res.body.regime).toBe('instantaneous');
    expect(res.body.cautions.join(' ')).toContain(GOVERNING);
  });

  it('surge: ethanol by name, dv 2.2 m/s (D: 789.3 * 1162 * 2.2 Pa)', async () => {
    const res = await op.get('/api/calc/surge?fluid=ethanol&velocityChangeMps=2.2').expect(200);
    expect(res.body.deltaPressurePa).toBeCloseTo(789.3 * 1162 * 2.2, 3);
    expect(res.body.waveSpeedMps).toBe(1162);
  });

  it('oxygen: 22 % is OSHA-normal but NFPA 53 enriched (OSHA 29 CFR 1910.146(b); NFPA 53)', async () => {
    const res = await op.get('/api/calc/oxygen?percent=22').expect(200);
    expect(res.body).toMatchObject({ classification: 'normal', nfpa53Enriched: true });
    expect((await op.get('/api/calc/oxygen?percent=19').expect(200)).body.classification).toBe('deficient');
  });

  it('bad numbers, out-of-range and extra parameters are 400s', async () => {
    expect((await op.get('/api/calc/oxygen?percent=abc').expect(400)).body.details[0].path).toBe('percent');
    expect((await op.get('/api/calc/oxygen?percent=120').expect(400)).body.details[0].path).toBe('percent');
    expect((await op.get('/api/calc/oxygen?percent=').expect(400)).body.code).toBe('validation_failed');
    await op.get('/api/calc/oxygen?percent=21&bogus=1').expect(400);
    await op.get('/api/calc/surge?velocityChangeMps=1').expect(400);
  });
});
