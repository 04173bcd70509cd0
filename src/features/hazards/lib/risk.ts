import { BUILT_IN_MATRIX_ID, type RiskMatrixDto } from '../../../contract/hazards';
import { DEFAULT_ACCEPTANCE_MAP } from '../../../domain/hazards/acceptance';
import { LEVEL_GLYPHS, MIL_STD_882E, riskLevel, type LevelGlyph, type RiskLevel, type RiskMatrix } from '../../../domain/hazards/matrix';
import { swatchFor } from '../../../domain/hazards/palette';
import type { Role } from '../../../domain/people/roles';

/** The built-in matrix, always at hand without a request. */
export const MATRIX: RiskMatrix = MIL_STD_882E;

/** A matrix as screens use it: the domain shape plus what the team set around it. */
export interface MatrixView extends RiskMatrix {
  builtIn: boolean;
  acceptanceMap: Readonly<Record<string, readonly Role[]>>;
  isDefault: boolean;
  retired: boolean;
  hazardCount: number;
}

export const BUILT_IN_VIEW: MatrixView = {
  ...MIL_STD_882E,
  builtIn: true,
  acceptanceMap: DEFAULT_ACCEPTANCE_MAP,
  isDefault: true,
  retired: false,
  hazardCount: 0,
};

const isGlyph = (g: unknown): g is LevelGlyph => typeof g === 'string' && (LEVEL_GLYPHS as readonly string[]).includes(g);

/** The server's matrix in the domain's shape (an unknown glyph falls back to none, drawn as a square). */
export function matrixFromDto(dto: RiskMatrixDto): MatrixView {
  return {
    id: dto.id,
    name: dto.name,
    severities: dto.severities,
    likelihoods: dto.likelihoods,
    levels: dto.levels.map((l) => ({ ...l, glyph: isGlyph(l.glyph) ? l.glyph : undefined })),
    cells: dto.cells,
    builtIn: dto.builtIn,
    acceptanceMap: dto.acceptanceMap,
    isDefault: dto.isDefault,
    retired: dto.retired,
    hazardCount: dto.hazardCount,
  };
}

/**
 * Matrices by id. The built-in one is always present, so built-in hazards draw before (or without) the
 * request; a team matrix that has not loaded yet is missing and callers say so rather than guess.
 */
export function matrixCatalogue(list: readonly RiskMatrixDto[] | undefined): Map<string, MatrixView> {
  const map = new Map<string, MatrixView>([[BUILT_IN_MATRIX_ID, BUILT_IN_VIEW]]);
  for (const dto of list ?? []) map.set(dto.id, matrixFromDto(dto));
  return map;
}

/** Level of a severity/likelihood pair in a matrix, or null while either is missing or unknown. */
export function levelIn(matrix: RiskMatrix | undefined, severity: string | null | undefined, likelihood: string | null | undefined): RiskLevel | null {
  if (!matrix || !severity || !likelihood) return null;
  try {
    return riskLevel(matrix, severity, likelihood);
  } catch {
    return null;
  }
}

/** A level by its key in a matrix, or null. */
export function levelByKey(matrix: RiskMatrix | undefined, key: string | null | undefined): RiskLevel | null {
  if (!matrix || !key) return null;
  return matrix.levels.find((l) => l.key === key) ?? null;
}

/**
 * The level the server computed for a hazard (`key`), drawn with its matrix. While a team matrix has not
 * loaded (or is unknown) the key itself is shown on the neutral swatch rather than guessing a colour.
 */
export function riskLevelOf(matrix: RiskMatrix | undefined, key: string | null | undefined): RiskLevel | null {
  if (!key) return null;
  return levelByKey(matrix, key) ?? { key, label: key, rank: -1, colour: '' };
}

/** Level for a severity/likelihood pair in the built-in matrix. */
export function levelFor(severity: string | null | undefined, likelihood: string | null | undefined): RiskLevel | null {
  return levelIn(MATRIX, severity, likelihood);
}

/**
 * One of the fixed swatch classes in styles.css (no inline style under the strict CSP). A level whose colour is
 * off the palette falls back to the neutral swatch; its glyph and word still tell it apart.
 */
export function levelClass(level: Pick<RiskLevel, 'key' | 'colour'> | string): string {
  if (typeof level === 'string') return KNOWN.has(level) ? `hf-risk hf-risk-${level}` : 'hf-risk';
  const swatch = swatchFor(level.colour);
  return swatch ? `hf-risk hf-risk-swatch-${swatch.key}` : 'hf-risk';
}
const KNOWN = new Set(['high', 'serious', 'medium', 'low', 'eliminated']);

function labelOf(entries: readonly { key: string; label: string }[], key: string): string {
  return entries.find((e) => e.key === key)?.label ?? key;
}

/** "2 Critical" / "C Occasional": the key people quote plus the word, in the given matrix. */
export function severityTextIn(matrix: RiskMatrix | undefined, key: string): string {
  return matrix ? `${key} ${labelOf(matrix.severities, key)}` : key;
}
export function likelihoodTextIn(matrix: RiskMatrix | undefined, key: string): string {
  return matrix ? `${key} ${labelOf(matrix.likelihoods, key)}` : key;
}

export function severityLabel(key: string): string {
  return labelOf(MATRIX.severities, key);
}
export function likelihoodLabel(key: string): string {
  return labelOf(MATRIX.likelihoods, key);
}
export function severityText(key: string): string {
  return severityTextIn(MATRIX, key);
}
export function likelihoodText(key: string): string {
  return likelihoodTextIn(MATRIX, key);
}

/** Levels worst first. */
export function levelsWorstFirst(matrix: RiskMatrix): RiskLevel[] {
  return [...matrix.levels].sort((a, b) => b.rank - a.rank);
}
