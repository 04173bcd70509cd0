import { describe, expect, it } from 'vitest';
import { propellantMass } from '../../src/domain/calc/propellantMass';
import { CalcInputError } from '../../src/domain/calc/errors';

function fieldOf(fn: () => unknown): string | undefined {
  try {
    fn();
  } catch (e) {
    if (e instanceof CalcInputError) return e.field;
    throw e;
  }
  return undefined;
}

describe('propellantMass', () => {
  it('uses LOX 1141 kg/m3 at the normal boiling point', () => {
    // NIST Chemistry WebBook, oxygen, saturation properties (read in a secondary copy): 1141 kg/m3
    // 40 L at 90 % fill: 1141 * 0.040 * 0.90 = 41.076 kg (D)
    const r = propellantMass({ propellant: 'lox', volumeL: 40, fillPercent: 90 });
    expect(r.densityKgM3).toBe(1141);
    expect(r.massKg).toBeCloseTo(1141 * 0.04 * 0.9, 9);
    expect(r.source).toMatch(/NIST/);
  });

  it('uses ethanol 789.3 kg/m3 at 20 C', () => {
    // CRC Handbook / NIOSH Pocket Guide (sp. gr. 0.79): 789.3 kg/m3; 20 L full -> 15.786 kg (D)
    expect(propellantMass({ propellant: 'ethanol', volumeL: 20, fillPercent: 100 }).massKg).toBeCloseTo(15.786, 6);
  });

  it('derives kerosene density from specific gravity 0.81', () => {
    // NIOSH Pocket Guide: sp. gr. 0.81 -> 810 kg/m3 (D); 10 L -> 8.1 kg
    const r = propellantMass({ propellant: 'kerosene', volumeL: 10, fillPercent: 100 });
    expect(r.massKg).toBeCloseTo(8.1, 6);
    expect(r.basis).toBe('D');
  });

  it('uses the blend table for ethanol-water', () => {
    // Perry's Chemical Engineers' Handbook, ethanol-water table (F2): 75 % by mass -> 856 kg/m3;
    // 10 L full -> 8.56 kg within 0.01 kg
    const r = propellantMass({ propellant: 'ethanol-water', volumeL: 10, fillPercent: 100, ethanolMassPercent: 75 });
    expect(Math.abs(r.massKg - 8.56)).toBeLessThan(0.01);
    expect(r.source).toMatch(/Perry/);
  });

  it('holds IPA and LN2 densities from memory', () => {
    // from memory: IPA 786 kg/m3 at 20 C
    const ipa = propellantMass({ propellant: 'ipa', volumeL: 1, fillPercent: 100 });
    expect(ipa.massKg).toBeCloseTo(0.786, 6);
    expect(ipa.basis).toBe('M');
    // from memory: LN2 806 kg/m3 at its normal boiling point (NIST Chemistry WebBook, nitrogen)
    const ln2 = propellantMass({ propellant: 'ln2', volumeL: 100, fillPercent: 50 });
    expect(ln2.massKg).toBeCloseTo(40.3, 6);
    expect(ln2.basis).toBe('M');
  });

  it('scales with fill and allows an empty tank', () => {
    const full = propellantMass({ propellant: 'lox', volumeL: 10, fillPercent: 100 }).massKg;
    expect(propellantMass({ propellant: 'lox', volumeL: 10, fillPercent: 25 }).massKg).toBeCloseTo(full / 4, 9);
    expect(propellantMass({ propellant: 'lox', volumeL: 10, fillPercent: 0 }).massKg).toBe(0);
  });

  it('rejects bad input with the field named', () => {
    expect(fieldOf(() => propellantMass({ propellant: 'lox', volumeL: -1, fillPercent: 50 }))).toBe('volumeL');
    expect(fieldOf(() => propellantMass({ propellant: 'lox', volumeL: 10, fillPercent: 100.5 }))).toBe('fillPercent');
    expect(fieldOf(() => propellantMass({ propellant: 'lox', volumeL: 10, fillPercent: -5 }))).toBe('fillPercent');
    expect(fieldOf(() => propellantMass({ propellant: 'lox', volumeL: Number.NaN, fillPercent: 50 }))).toBe('volumeL');
    expect(fieldOf(() => propellantMass({ propellant: 'lox', volumeL: Number.POSITIVE_INFINITY, fillPercent: 50 }))).toBe('volumeL');
    expect(fieldOf(() => propellantMass({ propellant: 'lox', volumeL: 1e9, fillPercent: 50 }))).toBe('volumeL');
    expect(fieldOf(() => propellantMass({ propellant: 'hydrazine', volumeL: 10, fillPercent: 50 }))).toBe('propellant');
    expect(fieldOf(() => propellantMass({ propellant: 'ethanol-water', volumeL: 10, fillPercent: 50 }))).toBe('ethanolMassPercent');
    expect(fieldOf(() => propellantMass({ propellant: 'ethanol-water', volumeL: 10, fillPercent: 50, ethanolMassPercent: 120 }))).toBe('ethanolMassPercent');
  });

  it('refuses gases and nitrous oxide, whose density is not one number', () => {
    for (const propellant of ['n2o', 'gn2', 'helium']) {
      expect(fieldOf(() => propellantMass({ propellant, volumeL: 10, fillPercent: 50 }))).toBe('propellant');
    }
  });
});
