import { BUILT_IN_MATRIX_ID, type HazardDto } from '../../../contract/hazards';
import { SYSTEM_LABELS, PHASE_LABELS, propellantName } from './labels';
import { HAZARD_STATUS_LABELS } from '../../../domain/hazards/mitigation';

export type MatrixMode = 'initial' | 'residual';

export interface RegisterFilters {
  q?: string;
  status?: string;
  system?: string;
  phase?: string;
  propellant?: string;
  risk?: string;
  /** Heat-map cell (see cellKey), e.g. "C2", read against `mode` and `matrix`. */
  cell?: string;
  /** The matrix the heat-map shows; the built-in one when not set. */
  matrix?: string;
  mode: MatrixMode;
}

/** Severity and likelihood a hazard has in the chosen assessment, or null when not yet assessed. */
export function cellOf(hazard: HazardDto, mode: MatrixMode): { severity: string; likelihood: string } | null {
  if (mode === 'initial') return { severity: String(hazard.initialSeverity), likelihood: hazard.initialLikelihood };
  if (hazard.residualSeverity === null || hazard.residualLikelihood === null) return null;
  return { severity: String(hazard.residualSeverity), likelihood: hazard.residualLikelihood };
}

/**
 * "C2" for the built-in matrix's one-letter likelihoods; "likely.major" once a likelihood key is longer,
 * so the pair can be read back (matrix keys never contain a dot).
 */
export function cellKey(likelihood: string, severity: string): string {
  return likelihood.length === 1 ? `${likelihood}${severity}` : `${likelihood}.${severity}`;
}

export function parseCellKey(cell: string): { likelihood: string; severity: string } {
  const dot = cell.indexOf('.');
  if (dot >= 0) return { likelihood: cell.slice(0, dot), severity: cell.slice(dot + 1) };
  return { likelihood: cell.slice(0, 1), severity: cell.slice(1) };
}

/** The matrix the heat-map is showing. */
export function shownMatrixId(f: RegisterFilters): string {
  return f.matrix ?? BUILT_IN_MATRIX_ID;
}

/** The hazards a heat-map of one matrix can place: only those assessed with that matrix. */
export function onMatrix(hazards: readonly HazardDto[], matrixId: string): HazardDto[] {
  return hazards.filter((h) => h.matrixId === matrixId);
}

/** The risk people act on: residual once assessed, else initial (same rule as the server's ?risk=). */
export function currentRisk(hazard: HazardDto): string {
  return hazard.residualRisk ?? hazard.initialRisk;
}

function haystack(h: HazardDto): string {
  return [h.code, h.title, h.description, ...h.causes, ...h.effects, ...h.energies, SYSTEM_LABELS[h.system], PHASE_LABELS[h.phase], ...h.propellants.map(propellantName)]
    .join(' \n ')
    .toLowerCase();
}

/** All filters except the heat-map cell: the heat-map counts what these leave, so a cell never hides itself. */
export function applyListFilters(hazards: readonly HazardDto[], f: RegisterFilters): HazardDto[] {
  const words = (f.q ?? '').toLowerCase().split(/\s+/).filter(Boolean);
  return hazards.filter(
    (h) =>
      (!f.status || h.status === f.status) &&
      (!f.system || h.system === f.system) &&
      (!f.phase || h.phase === f.phase) &&
      (!f.propellant || (h.propellants as string[]).includes(f.propellant)) &&
      (!f.risk || currentRisk(h) === f.risk) &&
      (words.length === 0 || words.every((w) => haystack(h).includes(w))),
  );
}

export function applyCellFilter(hazards: readonly HazardDto[], f: RegisterFilters): HazardDto[] {
  if (!f.cell) return [...hazards];
  const matrixId = shownMatrixId(f);
  return hazards.filter((h) => {
    if (h.matrixId !== matrixId) return false;
    const c = cellOf(h, f.mode);
    return c !== null && cellKey(c.likelihood, c.severity) === f.cell;
  });
}

/** Counts per cell ("C2" -> 3) for the heat-map, and how many hazards have no cell in this mode. */
export function countCells(hazards: readonly HazardDto[], mode: MatrixMode): { counts: Map<string, number>; unassessed: number } {
  const counts = new Map<string, number>();
  let unassessed = 0;
  for (const h of hazards) {
    const c = cellOf(h, mode);
    if (!c) {
      unassessed++;
      continue;
    }
    const key = cellKey(c.likelihood, c.severity);
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  return { counts, unassessed };
}

export function statusLabel(status: string): string {
  return (HAZARD_STATUS_LABELS as Record<string, string>)[status] ?? status;
}
