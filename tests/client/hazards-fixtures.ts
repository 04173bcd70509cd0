import type { HazardDto } from '../../src/contract/hazards';

/** Invented demo data: Tern Valley Rocketry Collective, engine Kestrel-2, Marsh End test site. */
export function hazard(overrides: Partial<HazardDto> & { id: number }): HazardDto {
  const { id } = overrides;
  return {
    code: `HZ-${String(id).padStart(3, '0')}`,
    title: `Hazard ${id}`,
    system: 'feed-system',
    phase: 'propellant-loading',
    description: '',
    causes: [],
    effects: [],
    propellants: [],
    energies: [],
    matrixId: 'mil-std-882e',
    initialSeverity: 2,
    initialLikelihood: 'C',
    initialRisk: 'serious',
    residualSeverity: null,
    residualLikelihood: null,
    residualRisk: null,
    status: 'open',
    mitigations: [],
    acceptances: [],
    acceptanceProgress: null,
    createdAt: '2026-03-01T09:00:00.000Z',
    updatedAt: '2026-03-02T09:00:00.000Z',
    ...overrides,
  };
}

export const kestrelHazards: HazardDto[] = [
  hazard({
    id: 1,
    title: 'LOX run tank overpressure on Kestrel-2',
    system: 'feed-system',
    propellants: ['lox'],
    causes: ['Vent valve stuck shut', 'Regulator creep'],
    effects: ['Tank rupture, fragments across Marsh End pad'],
    initialSeverity: 1,
    initialLikelihood: 'C',
    initialRisk: 'high',
    residualSeverity: 1,
    residualLikelihood: 'E',
    residualRisk: 'medium',
    status: 'awaiting-acceptance',
    mitigations: [
      { id: 11, kind: 'procedure-ppe', description: 'Stand-off checklist', owner: 'Mara Oduya', verificationMethod: 'Dry run', verificationStatus: 'planned', evidence: [] },
      { id: 12, kind: 'engineered-feature', description: 'Burst disc rated 1.1 × MEOP', owner: 'Ines Kovac', verificationMethod: 'Proof test', verificationStatus: 'verified', evidence: [] },
    ],
    acceptanceProgress: { requiredRoles: ['safety'], missingRoles: ['safety'], complete: false },
  }),
  hazard({ id: 2, title: 'Ethanol spill at the fuel fill point', system: 'ground-support', propellants: ['ethanol'], initialSeverity: 2, initialLikelihood: 'C', initialRisk: 'serious' }),
  hazard({ id: 3, title: 'Igniter fires early during "safing"', system: 'igniter', phase: 'safing', initialSeverity: 2, initialLikelihood: 'C', initialRisk: 'serious' }),
  hazard({ id: 4, title: 'GN2 bottle falls over', system: 'pressurant', phase: 'transport', propellants: ['gn2'], initialSeverity: 3, initialLikelihood: 'D', initialRisk: 'medium', status: 'closed' }),
];
