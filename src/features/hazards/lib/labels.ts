import type { HazardPhase, HazardSystem, VerificationStatus } from '../../../contract/hazards';
import type { Role } from '../../../domain/people/roles';
import { hasAnyRole } from '../../../domain/people/roles';
import { PROPELLANTS, type PropellantId } from '../../../domain/propellants/library';

export const SYSTEM_LABELS: Record<HazardSystem, string> = {
  engine: 'Engine',
  'feed-system': 'Feed system',
  pressurant: 'Pressurant',
  igniter: 'Igniter',
  'ground-support': 'Ground support',
  'test-site': 'Test site',
  other: 'Other',
};

export const PHASE_LABELS: Record<HazardPhase, string> = {
  transport: 'Transport',
  assembly: 'Assembly',
  'leak-check': 'Leak check',
  'propellant-loading': 'Propellant loading',
  firing: 'Firing',
  safing: 'Safing',
  detanking: 'Detanking',
};

export const VERIFICATION_LABELS: Record<VerificationStatus, string> = {
  planned: 'Planned',
  'in-progress': 'In progress',
  verified: 'Verified',
  failed: 'Failed',
};

export function propellantName(id: string): string {
  return (PROPELLANTS as Record<string, { name: string } | undefined>)[id]?.name ?? id;
}

export const PROPELLANT_OPTIONS = (Object.keys(PROPELLANTS) as PropellantId[]).map((id) => ({ value: id, label: PROPELLANTS[id].name }));

/** Safety officers and admins keep the register; everyone else reads it. */
export function canEditHazards(roles: readonly Role[]): boolean {
  return hasAnyRole(roles, ['safety', 'admin']);
}
