import { describe, expect, it } from 'vitest';
import {
  ETHANOL_WATER_FLASH_POINTS,
  PROPELLANTS,
  PROPELLANT_IDS,
  cautionsBySeverity,
  getPropellant,
  getProperty,
  type PropellantId,
} from '../../src/domain/propellants/library';

const value = (id: PropellantId, key: string) => getProperty(id, key)?.value;
const basis = (id: PropellantId, key: string) => getProperty(id, key)?.basis;

describe('propellant library structure', () => {
  it('holds the nine substances by id', () => {
    expect([...PROPELLANT_IDS].sort()).toEqual(
      ['ethanol', 'ethanol-water', 'gn2', 'helium', 'ipa', 'kerosene', 'ln2', 'lox', 'n2o'].sort(),
    );
    for (const id of PROPELLANT_IDS) expect(PROPELLANTS[id].id).toBe(id);
    expect(getPropellant('hydrazine')).toBeUndefined();
  });

  it.each(PROPELLANT_IDS)('%s: every property has a source, a basis and a unit', (id) => {
    for (const p of PROPELLANTS[id].properties) {
      expect(p.source.trim()).not.toBe('');
      expect(['F', 'F2', 'M', 'D']).toContain(p.basis);
      expect(p.unit.trim()).not.toBe('');
      // A value held from memory must say so where it is shown.
      if (p.basis === 'M') expect(p.source).toMatch(/from memory/);
    }
  });

  it.each(PROPELLANT_IDS)('%s: every caution and PPE item names where it comes from', (id) => {
    for (const c of PROPELLANTS[id].cautions) expect(c.source.trim(), c.key).not.toBe('');
    for (const item of PROPELLANTS[id].ppe) expect(item.source.trim(), item.text).not.toBe('');
  });

  it('cites the cleaning standards and the oxygen thresholds where a caution rests on them', () => {
    const source = (id: PropellantId, key: string) => PROPELLANTS[id].cautions.find((c) => c.key === key)?.source;
    expect(source('lox', 'clean-for-oxygen')).toBe('CGA G-4.1; ASTM G93'); // check-values section 4
    expect(source('lox', 'oxygen-enriched-atmosphere')).toBe('OSHA 29 CFR 1910.146(b); NFPA 53'); // check-values section 4
    expect(source('gn2', 'asphyxiation')).toMatch(/OSHA 29 CFR 1910\.146\(b\).*19\.5 %/); // check-values section 4
    expect(source('ethanol', 'flammable-vapour')).toBe('NIOSH Pocket Guide to Chemical Hazards, ethyl alcohol');
    // A rule of thumb says so rather than borrowing a source.
    expect(source('lox', 'cryogenic-burn')).toBe('common practice, no source');
  });

  it.each(PROPELLANT_IDS)('%s: has at least one warning and a PPE list', (id) => {
    expect(cautionsBySeverity(id, 'warning').length).toBeGreaterThan(0);
    expect(PROPELLANTS[id].ppe.length).toBeGreaterThan(0);
    const keys = PROPELLANTS[id].cautions.map((c) => c.key);
    expect(new Set(keys).size).toBe(keys.length);
  });
});

describe('property values against check-values section 3', () => {
  it('liquid oxygen', () => {
    expect(value('lox', 'normalBoilingPoint')).toBe(90.19); // NIST Chemistry WebBook, oxygen (secondary copy)
    expect(value('lox', 'densityNbp')).toBe(1141); // NIST Chemistry WebBook, saturation properties (secondary copy)
    expect(value('lox', 'expansionRatio')).toBe(860); // CGA P-1 / compressed gas handbooks
    expect(value('lox', 'speedOfSound')).toBe(950); // Kaye & Laby
    // 90.19 K - 273.15 = -182.96 C (check-values gives both)
    expect((value('lox', 'normalBoilingPoint') as number) - 273.15).toBeCloseTo(-182.96, 2);
  });

  it('ethanol', () => {
    expect(value('ethanol', 'density20C')).toBe(789.3); // CRC Handbook / NIOSH Pocket Guide
    expect(value('ethanol', 'flashPoint')).toBe(13); // NIOSH Pocket Guide, ethyl alcohol
    expect([value('ethanol', 'lel'), value('ethanol', 'uel')]).toEqual([3.3, 19]); // NIOSH Pocket Guide
    expect(value('ethanol', 'rel')).toBe(1000); // NIOSH Pocket Guide
    expect(value('ethanol', 'speedOfSound')).toBe(1162); // Kaye & Laby
  });

  it('ethanol-water', () => {
    expect(value('ethanol-water', 'density75Mass20C')).toBe(856); // Perry's (secondary copy)
    // Engineering ToolBox table (F2), mass or volume % unclear
    expect(ETHANOL_WATER_FLASH_POINTS.map((r) => r.flashPointC)).toEqual([62, 49, 36, 29, 26, 24, 22, 21, 20, 17, 17]);
    expect(ETHANOL_WATER_FLASH_POINTS.map((r) => r.ethanolPercent)).toEqual([5, 10, 20, 30, 40, 50, 60, 70, 80, 90, 96]);
  });

  it('kerosene, IPA and nitrous oxide', () => {
    expect(value('kerosene', 'flashPoint')).toEqual([38, 72]); // NIOSH Pocket Guide
    expect([value('kerosene', 'lel'), value('kerosene', 'uel')]).toEqual([0.7, 5]); // NIOSH Pocket Guide
    expect(value('kerosene', 'specificGravity')).toBe(0.81); // NIOSH Pocket Guide
    expect(basis('kerosene', 'density')).toBe('D'); // 0.81 x 1000 kg/m3
    expect([value('ipa', 'flashPoint'), value('ipa', 'lel'), value('ipa', 'uel')]).toEqual([12, 2.0, 12.7]); // NIOSH
    expect(value('ipa', 'density20C')).toBe(786); // from memory
    expect(basis('ipa', 'density20C')).toBe('M');
    expect(value('n2o', 'criticalTemperature')).toBe(309.57); // NIST
    expect(value('n2o', 'criticalPressure')).toBe(7.245); // NIST
    expect(value('n2o', 'rel')).toBe(25); // NIOSH Pocket Guide
    // NIOSH Pocket Guide: 51.3 atm * 0.101325 MPa/atm = 5.198 MPa, inside the stored 5.1-5.2 MPa (D)
    const [lo, hi] = value('n2o', 'vapourPressure20C') as [number, number];
    expect(51.3 * 0.101325).toBeGreaterThanOrEqual(lo);
    expect(51.3 * 0.101325).toBeLessThanOrEqual(hi);
  });

  it('liquid nitrogen (NBP and density from memory)', () => {
    expect(value('ln2', 'normalBoilingPoint')).toBe(77.36); // from memory (NIST Chemistry WebBook, nitrogen)
    expect(value('ln2', 'densityNbp')).toBe(806); // from memory (NIST Chemistry WebBook, nitrogen)
    expect(basis('ln2', 'densityNbp')).toBe('M');
    expect(value('ln2', 'expansionRatio')).toBe(696); // compressed gas handbooks
  });
});

describe('handling cautions', () => {
  const text = (id: PropellantId) => PROPELLANTS[id].cautions.map((c) => c.text).join(' ');
  const keys = (id: PropellantId) => PROPELLANTS[id].cautions.map((c) => c.key);

  it('liquid oxygen covers cold burns, enriched air, soaked clothing and oxygen cleaning', () => {
    expect(keys('lox')).toEqual(expect.arrayContaining(['cryogenic-burn', 'oxygen-enriched-atmosphere', 'oxygen-soaked-clothing', 'clean-for-oxygen']));
    // CGA G-4.1; ASTM G93: clean for oxygen service
    expect(text('lox')).toMatch(/CGA G-4\.1/);
    expect(text('lox')).toMatch(/ASTM G93/);
  });

  it('fuels state their flash point hazard', () => {
    expect(text('ethanol')).toMatch(/13 C/); // NIOSH Pocket Guide
    expect(text('ipa')).toMatch(/12 C/); // NIOSH Pocket Guide
    expect(keys('kerosene')).toContain('spray-ignition');
  });

  it('nitrous oxide warns of decomposition and stored pressure', () => {
    const n2o = PROPELLANTS.n2o.cautions;
    expect(n2o.find((c) => c.key === 'decomposition')?.severity).toBe('warning');
    expect(keys('n2o')).toContain('pressure-rises-with-temperature');
  });

  it('inert gases and LN2 warn of asphyxiation; gases of stored pressure', () => {
    for (const id of ['ln2', 'gn2', 'helium'] as const) expect(keys(id)).toContain('asphyxiation');
    for (const id of ['gn2', 'helium'] as const) expect(keys(id)).toContain('stored-pressure');
  });

  it('uses caution only for harm to equipment', () => {
    expect(PROPELLANTS.lox.cautions.find((c) => c.key === 'cold-embrittlement')?.severity).toBe('caution');
    expect(PROPELLANTS.lox.cautions.find((c) => c.key === 'cryogenic-burn')?.severity).toBe('warning');
  });
});
