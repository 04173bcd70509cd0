import { describe, expect, it } from 'vitest';
import {
  ETHANOL_WATER_DENSITY_20C,
  ethanolWaterDensity,
  ethanolWaterDensitySources,
} from '../../src/domain/calc/density';
import { CalcInputError } from '../../src/domain/calc/errors';

const RHO_WATER = 998.2; // water at 20 C; Perry's ethanol-water table, 0 % row (read in a secondary copy)
const RHO_ETHANOL = 789.3; // CRC Handbook / NIOSH Pocket Guide (sp. gr. 0.79)

describe('ethanolWaterDensity', () => {
  it('gives 856 kg/m3 at 75 % by mass, 20 C', () => {
    // Perry's Chemical Engineers' Handbook, ethanol-water table (F2): 856 kg/m3
    expect(Math.abs(ethanolWaterDensity(75) - 856)).toBeLessThanOrEqual(1);
  });

  it('differs from linear mixing of the pure densities by more than 1.5 % at 75 %', () => {
    // check-values section 3: a linear volume-weighted density is about 2 % low at 75 %.
    // Volumes adding (D): 1/rho = w/rho_e + (1-w)/rho_w = 0.75/789.3 + 0.25/998.2 -> 832.9 kg/m3
    const volumeAdditive = 1 / (0.75 / RHO_ETHANOL + 0.25 / RHO_WATER);
    // Mass-weighted average (D): 0.75*789.3 + 0.25*998.2 = 841.5 kg/m3
    const massWeighted = 0.75 * RHO_ETHANOL + 0.25 * RHO_WATER;
    const table = ethanolWaterDensity(75);
    expect((table - volumeAdditive) / table).toBeGreaterThan(0.015);
    expect((table - massWeighted) / table).toBeGreaterThan(0.015);
  });

  it('matches the pure liquids at the ends', () => {
    expect(ethanolWaterDensity(0)).toBeCloseTo(RHO_WATER, 6);
    expect(ethanolWaterDensity(100)).toBeCloseTo(RHO_ETHANOL, 6);
  });

  it('interpolates between rows close to the finer handbook table', () => {
    // Perry's Chemical Engineers' Handbook, ethanol-water table at 20 C, 0.1 % steps
    // (read in a secondary copy): 2.5 % -> 0.99363 kg/L, 12.0 % -> 0.97910 kg/L.
    expect(ethanolWaterDensity(2.5)).toBeCloseTo(993.63, 0);
    expect(Math.abs(ethanolWaterDensity(12) - 979.1)).toBeLessThan(0.5);
  });

  it('falls steadily from water to ethanol', () => {
    let previous = Infinity;
    for (let p = 0; p <= 100; p += 0.5) {
      const rho = ethanolWaterDensity(p);
      expect(rho).toBeLessThan(previous);
      previous = rho;
    }
  });

  it('lies above linear mixing everywhere inside the range (volume shrinks on mixing)', () => {
    for (let p = 5; p <= 95; p += 5) {
      const w = p / 100;
      expect(ethanolWaterDensity(p)).toBeGreaterThan(1 / (w / RHO_ETHANOL + (1 - w) / RHO_WATER));
    }
  });

  it('marks every table row with a source and basis, memory rows as from memory', () => {
    for (const row of ETHANOL_WATER_DENSITY_20C) {
      expect(row.source.length).toBeGreaterThan(0);
      if (row.basis === 'M') expect(row.source).toMatch(/from memory/);
    }
    expect(ETHANOL_WATER_DENSITY_20C.find((r) => r.massPercent === 75)?.basis).toBe('F2');
  });

  it('names the bracketing rows', () => {
    expect(ethanolWaterDensitySources(75)).toHaveLength(1);
    expect(ethanolWaterDensitySources(72).map((r) => r.massPercent)).toEqual([70, 75]);
  });

  it.each([-0.1, 100.1, Number.NaN, Number.POSITIVE_INFINITY])('rejects %s', (p) => {
    expect(() => ethanolWaterDensity(p)).toThrow(CalcInputError);
  });
});
