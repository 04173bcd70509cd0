import { describe, expect, it } from 'vitest';
import { manningCheck, neededStations } from '../../src/domain/procedures/manning';
import { checkSignoff, countability, isReleasedBy } from '../../src/domain/procedures/release';
import type { Phase } from '../../src/domain/procedures/steps';

const base = { tSeconds: null, instruction: 'x', hazardIds: [], propellants: [], note: '' };
const phases: Phase[] = [
  {
    key: 'p',
    name: 'Terminal count',
    steps: [
      { ...base, key: 'a', kind: 'action', station: 'PROP' },
      { ...base, key: 'b', kind: 'poll', station: 'TC', stations: ['PROP', 'RANGE', 'SAFE'] },
      { ...base, key: 'c', kind: 'action', station: 'PROP' },
    ],
  },
];

// Holdfire's rule: every station a procedure needs has at least one active person assigned.
describe('manning', () => {
  it('needs the listed stations, then each step\'s and each poll\'s, once each', () => {
    expect(neededStations(phases, ['DATA'])).toEqual(['DATA', 'PROP', 'TC', 'RANGE', 'SAFE']);
  });

  it('reports the unmanned stations and ignores deactivated people', () => {
    const check = manningCheck(['TC', 'PROP', 'SAFE'], [
      { station: 'TC', userId: 1, userName: 'Marek', active: true },
      { station: 'PROP', userId: 2, userName: 'Tomasz', active: false },
      { station: 'OTHER', userId: 3, userName: 'Aiko', active: true },
    ]);
    expect(check.ok).toBe(false);
    expect(check.unmanned).toEqual(['PROP', 'SAFE']);
    expect(check.inactive).toEqual([{ station: 'PROP', userId: 2, userName: 'Tomasz' }]);
    expect(check.stations[0]).toEqual({ station: 'TC', people: [{ userId: 1, userName: 'Marek' }], manned: true });
  });

  it('passes when every station is manned and flags one person on two stations', () => {
    const check = manningCheck(['TC', 'SAFE'], [
      { station: 'TC', userId: 1, userName: 'Marek', active: true },
      { station: 'SAFE', userId: 1, userName: 'Marek', active: true },
    ]);
    expect(check.ok).toBe(true);
    expect(check.doubled).toEqual([{ userId: 1, userName: 'Marek', stations: ['TC', 'SAFE'] }]);
  });
});

// Two-person release: a conductor and a safety officer who are different people (issue #4).
describe('sign-offs', () => {
  it('the second sign-off by a different person releases', () => {
    const first = checkSignoff('draft', [], { role: 'conductor', userId: 1 });
    expect(first).toEqual({ ok: true, releases: false });
    expect(checkSignoff('draft', [{ role: 'conductor', userId: 1 }], { role: 'safety', userId: 2 })).toEqual({ ok: true, releases: true });
  });

  it('refuses the same person for both roles, a role twice, and a released revision', () => {
    expect(checkSignoff('draft', [{ role: 'conductor', userId: 1 }], { role: 'safety', userId: 1 })).toMatchObject({ ok: false, code: 'same_person' });
    expect(checkSignoff('draft', [{ role: 'conductor', userId: 1 }], { role: 'conductor', userId: 1 })).toMatchObject({ ok: false, code: 'already_signed' });
    expect(checkSignoff('draft', [{ role: 'conductor', userId: 1 }], { role: 'conductor', userId: 2 })).toMatchObject({ ok: false, code: 'role_already_signed' });
    expect(checkSignoff('released', [], { role: 'safety', userId: 2 })).toMatchObject({ ok: false, code: 'not_draft' });
  });

  it('isReleasedBy needs both roles by two people', () => {
    expect(isReleasedBy([{ role: 'conductor', userId: 1 }])).toBe(false);
    expect(isReleasedBy([{ role: 'conductor', userId: 1 }, { role: 'safety', userId: 1 }])).toBe(false);
    expect(isReleasedBy([{ role: 'safety', userId: 2 }, { role: 'conductor', userId: 1 }])).toBe(true);
  });
});

describe('countability', () => {
  it('a draft is never countable', () => {
    expect(countability({ status: 'draft', number: 3, stepCount: 60 }, 2)).toMatchObject({ countable: false, reason: 'draft' });
    expect(countability({ status: 'draft', number: 1, stepCount: 60 }, null)).toMatchObject({ countable: false, reason: 'draft' });
  });

  it('only the latest released revision with steps is', () => {
    expect(countability({ status: 'released', number: 2, stepCount: 60 }, 2)).toEqual({ countable: true });
    expect(countability({ status: 'released', number: 1, stepCount: 60 }, 2)).toMatchObject({ countable: false, reason: 'superseded' });
    expect(countability({ status: 'released', number: 1, stepCount: 0 }, 1)).toMatchObject({ countable: false, reason: 'empty' });
  });
});
