import { describe, expect, it } from 'vitest';
import {
  KG_PER_LB,
  K_FT_PER_LB_CBRT,
  QD_CAUTION,
  USER_TNT_CAUTION,
  kMetric,
  quantityDistance,
} from '../../src/domain/calc/quantityDistance';
import { CalcInputError, UnlistedCombinationError } from '../../src/domain/calc/errors';

const FT_TO_M = 0.3048; // exact by definition of the international foot

describe('TNT equivalence (DoD 6055.9-STD / DESR 6055.09; NASA-STD-8719.12)', () => {
  it('uses 10 % for LO2 with alcohol or RP-1 on a static test stand', () => {
    // check-values section 5 (F2): static test stand 10 %
    for (const combination of ['lox-alcohol', 'lox-rp1']) {
      const r = quantityDistance({ propellantKg: 100, combination, setting: 'static-test-stand' });
      expect(r.tntKg).toBeCloseTo(10, 9);
      expect(r.tntPercentUsed).toBeCloseTo(10, 9);
    }
  });

  it('uses 20 % for a range launch below 500,000 lb', () => {
    // check-values section 5 (F2): range launch 20 % up to 500,000 lb
    const r = quantityDistance({ propellantKg: 1000, combination: 'lox-rp1', setting: 'range-launch' });
    expect(r.tntKg).toBeCloseTo(200, 9);
  });

  it('adds 10 % of the excess above 500,000 lb for a range launch', () => {
    // check-values section 5 (F2), worked in pounds (D): 300,000 kg = 661,386.8 lb;
    // TNT = 0.20 * 500,000 + 0.10 * (661,386.8 - 500,000) = 116,138.7 lb = 52,679.6 kg
    const lb = 300_000 / KG_PER_LB;
    const tntLb = 0.2 * 500_000 + 0.1 * (lb - 500_000);
    const r = quantityDistance({ propellantKg: 300_000, combination: 'lox-alcohol', setting: 'range-launch' });
    expect(r.tntKg).toBeCloseTo(tntLb * KG_PER_LB, 3);
    expect(r.tntKg).toBeCloseTo(52_679.6, 0);
    expect(r.tntPercentUsed).toBeLessThan(20);
  });

  it('uses 100 % for nitromethane, whatever the setting', () => {
    // check-values section 5 (F2): nitromethane 100 %
    expect(quantityDistance({ propellantKg: 7, combination: 'nitromethane' }).tntKg).toBeCloseTo(7, 9);
  });

  it('refuses an unlisted combination without a user equivalence (no silent default)', () => {
    // check-values section 5: combinations not listed need an individual hazard assessment
    expect(() => quantityDistance({ propellantKg: 100, combination: 'n2o-ethanol' })).toThrow(UnlistedCombinationError);
    expect(() => quantityDistance({ propellantKg: 100 })).toThrow(UnlistedCombinationError);
    try {
      quantityDistance({ propellantKg: 100, combination: 'n2o-ethanol' });
    } catch (e) {
      expect(e).toBeInstanceOf(CalcInputError);
      expect((e as CalcInputError).field).toBe('combination');
    }
  });

  it('accepts a user equivalence for an unlisted combination and says where it must come from', () => {
    const r = quantityDistance({ propellantKg: 100, combination: 'n2o-ethanol', tntPercent: 15 });
    expect(r.tntKg).toBeCloseTo(15, 9);
    expect(r.cautions).toContain(USER_TNT_CAUTION);
  });

  it('needs the setting for LO2 combinations', () => {
    expect(() => quantityDistance({ propellantKg: 100, combination: 'lox-alcohol' })).toThrow(/static test stand or a range launch/);
    expect(() => quantityDistance({ propellantKg: 100, combination: 'lox-alcohol', setting: 'garage' })).toThrow(CalcInputError);
  });
});

describe('quantity-distance D = K * W^(1/3)', () => {
  it('converts K with 1 ft/lb^(1/3) = 0.3967 m/kg^(1/3)', () => {
    // check-values section 5 K table: 40 -> 15.87, 24 -> 9.52, 18 -> 7.14, 9 -> 3.57 m/kg^(1/3)
    expect(kMetric('inhabitedBuilding')).toBeCloseTo(15.87, 2);
    expect(kMetric('publicTrafficRoute')).toBeCloseTo(9.52, 2);
    expect(kMetric('intralineUnbarricaded')).toBeCloseTo(7.14, 2);
    expect(kMetric('intralineBarricaded')).toBeCloseTo(3.57, 2);
  });

  it('gives IBD 34.19 m for 100 kg on a static stand (Kestrel-2 at Marsh End)', () => {
    // 100 kg LOX/ethanol, static stand 10 % -> 10 kg TNT (F2);
    // IBD = 15.87 * 10^(1/3) = 34.19 m (K = 40 ft/lb^(1/3), 1.2 psi, NSWC, Swisdak, F)
    const r = quantityDistance({ propellantKg: 100, combination: 'lox-alcohol', setting: 'static-test-stand' });
    expect(r.distancesM.inhabitedBuilding).toBeCloseTo(34.19, 1);
    // PTR (K 24, F2): 9.52 * 10^(1/3) = 20.51 m; intraline (K 18 / K 9, F2): 15.38 m / 7.69 m
    expect(r.distancesM.publicTrafficRoute).toBeCloseTo(24 * 0.3967 * Math.cbrt(10), 9);
    expect(r.distancesM.publicTrafficRoute).toBeCloseTo(20.51, 1);
    expect(r.distancesM.intralineUnbarricaded).toBeCloseTo(15.38, 1);
    expect(r.distancesM.intralineBarricaded).toBeCloseTo(7.69, 1);
  });

  it('agrees with the ft/lb path within 0.1 %', () => {
    // DoD 6055.9-STD form: D_ft = 40 * W_lb^(1/3); convert kg -> lb, compute, ft -> m (D)
    for (const tntKg of [0.5, 10, 2_500, 45_000]) {
      const r = quantityDistance({ propellantKg: tntKg, combination: 'nitromethane' });
      for (const [kind, kFt] of Object.entries(K_FT_PER_LB_CBRT)) {
        const dFt = kFt * Math.cbrt(tntKg / KG_PER_LB);
        const dM = dFt * FT_TO_M;
        const ours = r.distancesM[kind as keyof typeof K_FT_PER_LB_CBRT];
        expect(Math.abs(ours - dM) / dM).toBeLessThan(0.001);
      }
    }
  });

  it('keeps PTR at 60 % of IBD', () => {
    // check-values section 5: public traffic route is 60 % of IBD (24/40)
    const r = quantityDistance({ propellantKg: 500, combination: 'lox-rp1', setting: 'static-test-stand' });
    expect(r.distancesM.publicTrafficRoute / r.distancesM.inhabitedBuilding).toBeCloseTo(0.6, 9);
  });

  it('grows with the cube root of the charge: 8x the mass, 2x the distance', () => {
    const a = quantityDistance({ propellantKg: 100, combination: 'nitromethane' });
    const b = quantityDistance({ propellantKg: 800, combination: 'nitromethane' });
    expect(b.distancesM.inhabitedBuilding / a.distancesM.inhabitedBuilding).toBeCloseTo(2, 9);
  });

  it('always carries the blast-only and governing-code caution', () => {
    const r = quantityDistance({ propellantKg: 100, combination: 'lox-rp1', setting: 'static-test-stand' });
    expect(r.cautions).toContain(QD_CAUTION);
    expect(QD_CAUTION).toMatch(/blast only/);
    expect(QD_CAUTION).toMatch(/fragments and heat/);
    expect(QD_CAUTION).toMatch(/governing code/);
    expect(QD_CAUTION).toMatch(/licensed authority/);
  });

  it.each([
    ['propellantKg', { propellantKg: 0, combination: 'nitromethane' }],
    ['propellantKg', { propellantKg: -5, combination: 'nitromethane' }],
    ['propellantKg', { propellantKg: Number.NaN, combination: 'nitromethane' }],
    ['propellantKg', { propellantKg: Number.POSITIVE_INFINITY, combination: 'nitromethane' }],
    ['propellantKg', { propellantKg: 1e12, combination: 'nitromethane' }],
    ['tntPercent', { propellantKg: 10, tntPercent: 0 }],
    ['tntPercent', { propellantKg: 10, tntPercent: -3 }],
    ['tntPercent', { propellantKg: 10, tntPercent: 5000 }],
    ['tntPercent', { propellantKg: 10, tntPercent: Number.NaN }],
  ])('rejects bad %s', (field, input) => {
    expect(() => quantityDistance(input)).toThrow(expect.objectContaining({ field }));
  });
});
