import { describe, expect, it } from 'vitest';
import {
  DEFAULT_ACCEPTANCE_MAP,
  acceptanceProgress,
  validateAcceptanceMap,
  type AcceptanceMap,
} from '../../src/domain/hazards/acceptance';
import { MIL_STD_882E } from '../../src/domain/hazards/matrix';
import type { Role } from '../../src/domain/people/roles';

// Acceptance authority per level follows MIL-STD-882E section 4.3.7 (F2): higher level, higher
// authority, with concurrence before Serious and High. Mapping to roles: common practice, no source.

describe('default acceptance map', () => {
  it('fits the MIL-STD-882E matrix', () => {
    expect(validateAcceptanceMap(DEFAULT_ACCEPTANCE_MAP, MIL_STD_882E)).toEqual([]);
  });

  it('needs safety and admin for high and serious, safety alone below', () => {
    expect([...DEFAULT_ACCEPTANCE_MAP.high].sort()).toEqual(['admin', 'safety']);
    expect([...DEFAULT_ACCEPTANCE_MAP.serious].sort()).toEqual(['admin', 'safety']);
    for (const level of ['medium', 'low', 'eliminated']) expect(DEFAULT_ACCEPTANCE_MAP[level]).toEqual(['safety']);
  });
});

describe('acceptanceProgress', () => {
  const map = DEFAULT_ACCEPTANCE_MAP;

  it('is complete for a high risk signed by two different people', () => {
    const r = acceptanceProgress(map, 'high', [
      { userId: 'u-safety', role: 'safety' },
      { userId: 'u-director', role: 'admin' },
    ]);
    expect(r).toEqual({ complete: true, missingRoles: [], problems: [] });
  });

  it('is not complete when one person signs both roles', () => {
    const r = acceptanceProgress(map, 'serious', [
      { userId: 'u-1', role: 'safety' },
      { userId: 'u-1', role: 'admin' },
    ]);
    expect(r.complete).toBe(false);
    expect(r.missingRoles).toHaveLength(1);
    expect(r.problems.join(' ')).toMatch(/one person can fill only one required role/);
  });

  it('finds the working assignment when a dual-role person signs first', () => {
    // u-1 signed both roles, u-2 only safety: u-1 must be the admin for this to complete.
    const r = acceptanceProgress(map, 'high', [
      { userId: 'u-1', role: 'safety' },
      { userId: 'u-1', role: 'admin' },
      { userId: 'u-2', role: 'safety' },
    ]);
    expect(r.complete).toBe(true);
    expect(r.missingRoles).toEqual([]);
  });

  it('lists the roles still missing', () => {
    expect(acceptanceProgress(map, 'high', []).missingRoles.sort()).toEqual(['admin', 'safety']);
    expect(acceptanceProgress(map, 'high', [{ userId: 'u-2', role: 'admin' }]).missingRoles).toEqual(['safety']);
  });

  it('needs only the safety officer for medium, low and eliminated', () => {
    for (const level of ['medium', 'low', 'eliminated']) {
      expect(acceptanceProgress(map, level, [{ userId: 'u-s', role: 'safety' }]).complete).toBe(true);
      expect(acceptanceProgress(map, level, [{ userId: 'u-a', role: 'admin' }]).complete).toBe(false);
    }
  });

  it('flags signatures that do not count', () => {
    const r = acceptanceProgress(map, 'low', [
      { userId: 'u-s', role: 'safety' },
      { userId: 'u-s', role: 'safety' },
      { userId: 'u-o', role: 'operator' },
      { userId: '', role: 'safety' },
    ]);
    expect(r.complete).toBe(true);
    expect(r.problems).toHaveLength(3);
  });

  it('does not let a blank user id fill a role', () => {
    expect(acceptanceProgress(map, 'low', [{ userId: '  ', role: 'safety' }]).complete).toBe(false);
  });

  it('reports an unknown level rather than passing it', () => {
    const r = acceptanceProgress(map, 'extreme', [{ userId: 'u-s', role: 'safety' }]);
    expect(r.complete).toBe(false);
    expect(r.problems[0]).toMatch(/No acceptance authority/);
  });

  it('handles a team map needing three distinct people', () => {
    const team: AcceptanceMap = { ...map, high: ['safety', 'admin', 'conductor'] };
    const sigs = [
      { userId: 'a', role: 'safety' as Role },
      { userId: 'b', role: 'admin' as Role },
      { userId: 'b', role: 'conductor' as Role },
    ];
    expect(acceptanceProgress(team, 'high', sigs).complete).toBe(false);
    expect(acceptanceProgress(team, 'high', [...sigs, { userId: 'c', role: 'conductor' }]).complete).toBe(true);
  });
});

describe('validateAcceptanceMap', () => {
  it('flags missing levels, unknown roles and levels, and a worse level needing less', () => {
    const bad: AcceptanceMap = {
      high: ['safety'],
      serious: ['safety', 'admin'],
      medium: ['safety', 'wizard' as Role],
      low: [],
      extra: ['safety'],
    };
    const problems = validateAcceptanceMap(bad, MIL_STD_882E).join('\n');
    expect(problems).toMatch(/'low' has no acceptance authority/);
    expect(problems).toMatch(/'eliminated' has no acceptance authority/);
    expect(problems).toMatch(/unknown roles: wizard/);
    expect(problems).toMatch(/level 'extra'/);
    expect(problems).toMatch(/'high' needs fewer authorities than the milder level 'serious'/);
  });
});
