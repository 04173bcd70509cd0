import { describe, expect, it } from 'vitest';
import { PROPELLANTS, type PropellantId } from '../../src/domain/propellants/library';
import {
  mitigationLevel,
  resolveCautions,
  type HazardForCautions,
  type PropellantForCautions,
} from '../../src/domain/procedures/cautions';

// Warning (harm to people) before caution (harm to equipment) before note: the order procedures print them in
// (common practice, no source). Which link becomes which level is Holdfire's rule, documented in docs/procedures.md.
const hazard = (id: number, status: HazardForCautions['status'], mitigations: HazardForCautions['mitigations']): HazardForCautions => ({
  id,
  code: `HZ-${String(id).padStart(3, '0')}`,
  status,
  mitigations,
});
const hazards = new Map<number, HazardForCautions>([
  [
    1,
    hazard(1, 'accepted', [
      { id: 10, kind: 'procedure-ppe', description: 'Nobody at the stand above 50 % of MEOP.', verificationStatus: 'verified' },
      { id: 11, kind: 'engineered-feature', description: 'Relief valve below the lowest-rated part.', verificationStatus: 'in-progress' },
    ]),
  ],
  [2, hazard(2, 'closed', [{ id: 20, kind: 'procedure-ppe', description: 'Closed hazard text.', verificationStatus: 'verified' }])],
  [3, hazard(3, 'open', [{ id: 30, kind: 'warning-device', description: 'Siren before each firing.', verificationStatus: 'planned' }])],
]);
const library = (id: PropellantId): PropellantForCautions => ({ ...PROPELLANTS[id], cautions: [...PROPELLANTS[id].cautions], ppe: PROPELLANTS[id].ppe.map((item) => item.text) });
const propellants = new Map<PropellantId, PropellantForCautions>((['lox', 'ethanol', 'ethanol-water'] as const).map((id) => [id, library(id)]));

describe('mitigationLevel', () => {
  it('crew mitigations are warnings, hardware mitigations notes', () => {
    expect(mitigationLevel('procedure-ppe')).toBe('warning');
    expect(mitigationLevel('warning-device')).toBe('warning');
    expect(mitigationLevel('engineered-feature')).toBe('note');
    expect(mitigationLevel('design-alteration')).toBe('note');
    expect(mitigationLevel('design-selection')).toBe('note');
  });
});

describe('resolveCautions', () => {
  it('orders warnings, cautions, notes and keeps link order inside each', () => {
    const out = resolveCautions({ hazardIds: [3, 1], propellants: ['lox'], note: 'Open slowly.' }, hazards, propellants);
    const levels = out.map((c) => c.level);
    expect(levels).toEqual([...levels].sort((a, b) => ['warning', 'caution', 'note'].indexOf(a) - ['warning', 'caution', 'note'].indexOf(b)));
    const warnings = out.filter((c) => c.level === 'warning').map((c) => c.text);
    expect(warnings[0]).toBe('Siren before each firing.');
    expect(warnings[1]).toBe('Nobody at the stand above 50 % of MEOP.');
    // The library's LOX warnings follow the hazard warnings; its one equipment caution is a caution.
    const loxWarnings = PROPELLANTS.lox.cautions.filter((c) => c.severity === 'warning').map((c) => c.text);
    expect(warnings.slice(2)).toEqual(loxWarnings);
    expect(out.filter((c) => c.level === 'caution').map((c) => c.text)).toEqual(
      PROPELLANTS.lox.cautions.filter((c) => c.severity === 'caution').map((c) => c.text),
    );
    const notes = out.filter((c) => c.level === 'note');
    expect(notes.map((c) => c.text)).toEqual([
      'Open slowly.',
      'Relief valve below the lowest-rated part.',
      `PPE for liquid oxygen: ${PROPELLANTS.lox.ppe.map((item) => item.text).join('; ')}.`,
    ]);
    expect(notes[1]!.sources[0]).toMatchObject({ type: 'hazard', hazardCode: 'HZ-001', mitigationId: 11, verificationStatus: 'in-progress' });
  });

  it('leaves out closed hazards and unknown links', () => {
    const out = resolveCautions({ hazardIds: [2, 404], propellants: [], note: '' }, hazards, propellants);
    expect(out).toEqual([]);
  });

  it('shows the same text once, with every source', () => {
    // Ethanol and the ethanol-water blend share the library's static and invisible-flame warnings.
    const out = resolveCautions({ hazardIds: [], propellants: ['ethanol', 'ethanol-water'], note: '' }, hazards, propellants);
    const statics = out.filter((c) => c.text === PROPELLANTS.ethanol.cautions.find((x) => x.key === 'static-ignition')!.text);
    expect(statics).toHaveLength(1);
    expect(statics[0]!.sources.map((s) => (s.type === 'propellant' ? s.propellantId : s.type))).toEqual(['ethanol', 'ethanol-water']);
    // Each PPE note names its liquid, so the two stay apart.
    expect(out.filter((c) => c.level === 'note')).toHaveLength(2);
  });

  it('uses a team\'s edited cautions when given them', () => {
    const edited = new Map(propellants);
    edited.set('lox', { ...library('lox'), cautions: [{ key: 'team', severity: 'caution', text: 'Team caution.', source: 'common practice, no source' }], ppe: [] });
    const out = resolveCautions({ hazardIds: [], propellants: ['lox'], note: '' }, hazards, edited);
    expect(out).toEqual([{ level: 'caution', text: 'Team caution.', sources: [{ type: 'propellant', propellantId: 'lox', cautionKey: 'team' }] }]);
  });
});
