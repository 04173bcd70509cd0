import { describe, expect, it } from 'vitest';
import { SURGE_CAUTION, elasticPipeWaveSpeed, surge } from '../../src/domain/calc/surge';
import { CalcInputError } from '../../src/domain/calc/errors';

describe('Joukowsky surge dp = rho * c * dv (Wylie & Streeter, Fluid Transients)', () => {
  it('gives 1.480 MPa for water stopped from 1 m/s', () => {
    // check-values section 6 worked example (D): 998.2 * 1482.3 * 1 = 1.480 MPa
    // (speed of sound in water at 20 C: Kaye & Laby)
    const r = surge({ fluid: 'water', velocityChangeMps: 1 });
    expect(r.deltaPressurePa / 1e6).toBeCloseTo(1.48, 3);
    expect(r.waveSpeedMps).toBe(1482.3);
    expect(r.regime).toBe('instantaneous');
  });

  it('gives 789.3 * 1162 * 2.2 Pa for ethanol stopped from 2.2 m/s', () => {
    // ethanol 789.3 kg/m3 (CRC Handbook / NIOSH Pocket Guide), c 1162 m/s at 20 C (Kaye & Laby)
    expect(surge({ fluid: 'ethanol', velocityChangeMps: 2.2 }).deltaPressurePa).toBeCloseTo(789.3 * 1162 * 2.2, 3);
  });

  it('uses LOX 1141 kg/m3 and 950 m/s', () => {
    // LOX 1141 kg/m3 (NIST Chemistry WebBook, secondary copy), c 950 m/s at -186 C (Kaye & Laby)
    expect(surge({ fluid: 'lox', velocityChangeMps: 3 }).deltaPressurePa).toBeCloseTo(1141 * 950 * 3, 3);
  });

  it('accepts density and wave speed directly', () => {
    expect(surge({ densityKgM3: 1000, waveSpeedMps: 1200, velocityChangeMps: 0.5 }).deltaPressurePa).toBeCloseTo(600_000, 6);
  });
});

describe('valve closure time against 2L/c', () => {
  it('is instantaneous at or below 2L/c', () => {
    // 2L/c = 2 * 30 / 1482.3 = 0.040478 s (D)
    const tc = (2 * 30) / 1482.3;
    const at = surge({ fluid: 'water', velocityChangeMps: 1, pipeLengthM: 30, valveTimeS: tc });
    expect(at.regime).toBe('instantaneous');
    expect(at.criticalTimeS).toBeCloseTo(tc, 12);
    expect(at.deltaPressurePa).toBeCloseTo(998.2 * 1482.3, 6);
  });

  it('scales by (2L/c)/T for slower closure', () => {
    // check-values section 6 (F2): dp ~ rho*c*dv*(2L/c)/T = 998.2*1482.3*1*(20/1482.3)/0.1 = 199,640 Pa (D)
    const r = surge({ fluid: 'water', velocityChangeMps: 1, pipeLengthM: 10, valveTimeS: 0.1 });
    expect(r.regime).toBe('gradual');
    expect(r.deltaPressurePa).toBeCloseTo((998.2 * 1482.3 * (20 / 1482.3)) / 0.1, 6);
    expect(r.deltaPressurePa).toBeCloseTo(199_640, 0);
  });

  it('never gives less than the instantaneous value just below 2L/c, nor more above it', () => {
    const full = 998.2 * 1482.3 * 1;
    const tc = 20 / 1482.3;
    expect(surge({ fluid: 'water', velocityChangeMps: 1, pipeLengthM: 10, valveTimeS: tc * 0.99 }).deltaPressurePa).toBeCloseTo(full, 6);
    expect(surge({ fluid: 'water', velocityChangeMps: 1, pipeLengthM: 10, valveTimeS: tc * 1.01 }).deltaPressurePa).toBeLessThan(full);
  });

  it('shows the worst case, and says so, when no valve time is given', () => {
    const r = surge({ fluid: 'water', velocityChangeMps: 1, pipeLengthM: 10 });
    expect(r.regime).toBe('instantaneous');
    expect(r.cautions.join(' ')).toMatch(/worst-case/);
  });
});

describe('elastic pipe wave speed c = sqrt((K/rho)/(1 + K*D/(E*e))) (fluid-transients texts)', () => {
  // from memory: water bulk modulus K = 2.2 GPa; steel E = 200 GPa
  const K = 2.2e9;
  const E = 200e9;

  it('matches the formula for a 20 mm bore, 2 mm wall steel line', () => {
    // K*D/(E*e) = 2.2e9*0.02/(200e9*0.002) = 0.11; c = sqrt((2.2e9/998.2)/1.11) = 1409.1 m/s (D)
    const c = elasticPipeWaveSpeed({ bulkModulusPa: K, densityKgM3: 998.2, innerDiameterM: 0.02, wallThicknessM: 0.002, pipeModulusPa: E });
    expect(c).toBeCloseTo(Math.sqrt(K / 998.2 / 1.11), 9);
    expect(c).toBeCloseTo(1409.1, 0);
  });

  it('derives water K from rho * c^2 within 1 % of 2.2 GPa', () => {
    // rho*c^2 = 998.2 * 1482.3^2 = 2.193 GPa (D) vs 2.2 GPa (from memory)
    const r = surge({ fluid: 'water', velocityChangeMps: 1, innerDiameterM: 0.02, wallThicknessM: 0.002, pipeModulusPa: E });
    const withMemoryK = Math.sqrt(K / 998.2 / (1 + (K * 0.02) / (E * 0.002)));
    expect(Math.abs(r.waveSpeedMps - withMemoryK) / withMemoryK).toBeLessThan(0.005);
    expect(r.waveSpeedMps).toBeLessThan(1482.3);
    expect(r.deltaPressurePa).toBeCloseTo(998.2 * r.waveSpeedMps, 6);
  });

  it('approaches the bulk sound speed as the wall gets very stiff', () => {
    const c = elasticPipeWaveSpeed({ bulkModulusPa: K, densityKgM3: 998.2, innerDiameterM: 0.02, wallThicknessM: 0.5, pipeModulusPa: 1e12 });
    expect(c).toBeCloseTo(Math.sqrt(K / 998.2), -1);
  });
});

describe('surge input checks', () => {
  const field = (fn: () => unknown) => {
    try {
      fn();
    } catch (e) {
      return e instanceof CalcInputError ? e.field : 'not a CalcInputError';
    }
    return 'no error';
  };

  it('rejects bad or conflicting input', () => {
    expect(field(() => surge({ fluid: 'mercury', velocityChangeMps: 1 }))).toBe('fluid');
    expect(field(() => surge({ fluid: 'water', densityKgM3: 1000, velocityChangeMps: 1 }))).toBe('fluid');
    expect(field(() => surge({ velocityChangeMps: 1 }))).toBe('densityKgM3');
    expect(field(() => surge({ densityKgM3: 1000, velocityChangeMps: 1 }))).toBe('waveSpeedMps');
    expect(field(() => surge({ fluid: 'water', velocityChangeMps: -1 }))).toBe('velocityChangeMps');
    expect(field(() => surge({ fluid: 'water', velocityChangeMps: Number.NaN }))).toBe('velocityChangeMps');
    expect(field(() => surge({ fluid: 'water', velocityChangeMps: 1e6 }))).toBe('velocityChangeMps');
    expect(field(() => surge({ fluid: 'water', velocityChangeMps: 1, valveTimeS: 0.1 }))).toBe('pipeLengthM');
    expect(field(() => surge({ fluid: 'water', velocityChangeMps: 1, pipeLengthM: 0 }))).toBe('pipeLengthM');
    expect(field(() => surge({ fluid: 'water', velocityChangeMps: 1, innerDiameterM: 0.02 }))).toBe('wallThicknessM');
    expect(field(() => surge({ densityKgM3: 900, velocityChangeMps: 1, innerDiameterM: 0.02, wallThicknessM: 0.002, pipeModulusPa: 2e11 }))).toBe('bulkModulusPa');
    expect(field(() => surge({ densityKgM3: Number.POSITIVE_INFINITY, waveSpeedMps: 1000, velocityChangeMps: 1 }))).toBe('densityKgM3');
  });

  it('carries the governing-code caution on every result', () => {
    expect(surge({ fluid: 'lox', velocityChangeMps: 0 }).cautions).toContain(SURGE_CAUTION);
    expect(SURGE_CAUTION).toMatch(/governing code/);
  });
});
