import type { HazardDto } from '../../../contract/hazards';
import { HAZARD_STATUS_LABELS } from '../../../domain/hazards/mitigation';
import { toCsv } from './csv';
import { PHASE_LABELS, SYSTEM_LABELS, propellantName } from './labels';

const HEADER = [
  'Code',
  'Title',
  'System',
  'Phase',
  'Status',
  'Description',
  'Causes',
  'Effects',
  'Propellants',
  'Energies',
  'Initial severity',
  'Initial likelihood',
  'Initial risk',
  'Residual severity',
  'Residual likelihood',
  'Residual risk',
  'Mitigations',
  'Updated',
] as const;

/** The register as CSV, in the order given (the table's current sort and filters). */
export function hazardsToCsv(hazards: readonly HazardDto[]): string {
  return toCsv(
    HEADER,
    hazards.map((h) => [
      h.code,
      h.title,
      SYSTEM_LABELS[h.system] ?? h.system,
      PHASE_LABELS[h.phase] ?? h.phase,
      HAZARD_STATUS_LABELS[h.status] ?? h.status,
      h.description,
      h.causes,
      h.effects,
      h.propellants.map(propellantName),
      h.energies,
      h.initialSeverity,
      h.initialLikelihood,
      h.initialRisk,
      h.residualSeverity ?? '',
      h.residualLikelihood ?? '',
      h.residualRisk ?? '',
      h.mitigations.map((m) => m.description),
      h.updatedAt,
    ]),
  );
}
