import { describe, expect, it } from 'vitest';
import { OXYGEN_CAUTION, classifyOxygen } from '../../src/domain/calc/oxygen';
import { CalcInputError } from '../../src/domain/calc/errors';

describe('classifyOxygen', () => {
  // OSHA 29 CFR 1910.146(b): deficient below 19.5 %, enriched above 23.5 % (F)
  it.each([
    [0, 'deficient'],
    [19.49, 'deficient'],
    [19.5, 'normal'],
    [20.9, 'normal'],
    [23.5, 'normal'],
    [23.51, 'enriched'],
    [100, 'enriched'],
  ])('%s %% is %s (OSHA 29 CFR 1910.146(b))', (percent, classification) => {
    expect(classifyOxygen(percent).classification).toBe(classification);
  });

  // NFPA 53 (F2): above 21 % by volume is oxygen-enriched
  it.each([
    [20.9, false],
    [21, false],
    [21.01, true],
    [22, true],
  ])('%s %% NFPA 53 enriched: %s', (percent, enriched) => {
    expect(classifyOxygen(percent).nfpa53Enriched).toBe(enriched);
  });

  it('flags the band OSHA calls normal but NFPA 53 calls enriched', () => {
    const r = classifyOxygen(22.5);
    expect(r.classification).toBe('normal');
    expect(r.nfpa53Enriched).toBe(true);
  });

  it('carries the caution', () => {
    expect(classifyOxygen(20.9).cautions).toEqual([OXYGEN_CAUTION]);
  });

  it.each([-1, 100.1, Number.NaN, Number.NEGATIVE_INFINITY])('rejects %s', (p) => {
    expect(() => classifyOxygen(p)).toThrow(CalcInputError);
  });
});
