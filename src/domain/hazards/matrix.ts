/**
 * Risk matrices: the built-in MIL-STD-882E matrix and team-defined ones of the
 * same shape. Pure data and lookups; screens decide how to draw them.
 */
import { isHexColour } from './contrast';

export interface AxisEntry {
  key: string;
  label: string;
  /** What the category or level means for this team, in its own words. */
  description?: string;
}

/** Shapes drawn beside the label so a level is never told by colour alone. */
export const LEVEL_GLYPHS = ['octagon', 'triangle', 'diamond', 'circle', 'dash', 'square', 'star', 'hexagon'] as const;
export type LevelGlyph = (typeof LEVEL_GLYPHS)[number];

export interface RiskLevel {
  key: string;
  label: string;
  /** Higher = worse. */
  rank: number;
  /** #rrggbb fill on the daylight theme; labels on it are white. */
  colour: string;
  /** #rrggbb text and outline colour on the dim red-shifted night theme. */
  nightColour?: string;
  glyph?: LevelGlyph;
}

export interface RiskMatrix {
  id: string;
  name: string;
  severities: AxisEntry[];
  likelihoods: AxisEntry[];
  levels: RiskLevel[];
  /** cells[likelihoodKey][severityKey] = levelKey */
  cells: Record<string, Record<string, string>>;
}

/** Surfaces the built-in colours are checked against (WCAG contrast tests). */
export const THEME_SURFACES = {
  day: '#FFFFFF',
  dayPaper: '#F6F3EC',
  night: '#170B08',
  /** Label colour on a day-theme level fill. */
  dayLabel: '#FFFFFF',
} as const;

export const SEVERITY_CATEGORIES = [
  { key: '1', label: 'Catastrophic' },
  { key: '2', label: 'Critical' },
  { key: '3', label: 'Marginal' },
  { key: '4', label: 'Negligible' },
] as const satisfies readonly AxisEntry[];
export type SeverityCategory = (typeof SEVERITY_CATEGORIES)[number]['key'];

export const LIKELIHOOD_LEVELS = [
  { key: 'A', label: 'Frequent' },
  { key: 'B', label: 'Probable' },
  { key: 'C', label: 'Occasional' },
  { key: 'D', label: 'Remote' },
  { key: 'E', label: 'Improbable' },
  { key: 'F', label: 'Eliminated' },
] as const satisfies readonly AxisEntry[];
export type LikelihoodLevel = (typeof LIKELIHOOD_LEVELS)[number]['key'];

export type MilStdLevel = 'high' | 'serious' | 'medium' | 'low' | 'eliminated';

// Our own palette: deep, muted fills that carry white labels in daylight, and
// warm low-blue tints for the night theme so dark-adapted eyes are spared.
const MIL_LEVELS: RiskLevel[] = [
  { key: 'high', label: 'High', rank: 4, colour: '#A3172C', nightColour: '#FF7A66', glyph: 'octagon' },
  { key: 'serious', label: 'Serious', rank: 3, colour: '#A64B0C', nightColour: '#F29A52', glyph: 'triangle' },
  { key: 'medium', label: 'Medium', rank: 2, colour: '#7A5C00', nightColour: '#D9B36A', glyph: 'diamond' },
  { key: 'low', label: 'Low', rank: 1, colour: '#2B6A4E', nightColour: '#C9A48C', glyph: 'circle' },
  { key: 'eliminated', label: 'Eliminated', rank: 0, colour: '#56606D', nightColour: '#9C8579', glyph: 'dash' },
];

/** MIL-STD-882E Table III, rows A..F, columns 1..4. */
export const MIL_STD_882E: RiskMatrix = {
  id: 'mil-std-882e',
  name: 'MIL-STD-882E risk assessment matrix',
  severities: SEVERITY_CATEGORIES.map((s) => ({ ...s })),
  likelihoods: LIKELIHOOD_LEVELS.map((l) => ({ ...l })),
  levels: MIL_LEVELS,
  cells: {
    A: { '1': 'high', '2': 'high', '3': 'serious', '4': 'medium' },
    B: { '1': 'high', '2': 'high', '3': 'serious', '4': 'medium' },
    C: { '1': 'high', '2': 'serious', '3': 'medium', '4': 'low' },
    D: { '1': 'serious', '2': 'medium', '3': 'medium', '4': 'low' },
    E: { '1': 'medium', '2': 'medium', '3': 'medium', '4': 'low' },
    F: { '1': 'eliminated', '2': 'eliminated', '3': 'eliminated', '4': 'eliminated' },
  },
};

export type MatrixProblemCode =
  | 'empty-id'
  | 'empty-name'
  | 'empty-axis'
  | 'empty-key'
  | 'empty-label'
  | 'duplicate-key'
  | 'duplicate-rank'
  | 'bad-rank'
  | 'bad-colour'
  | 'bad-glyph'
  | 'missing-row'
  | 'missing-cell'
  | 'unknown-level'
  | 'unknown-row'
  | 'unknown-column'
  | 'off-palette'
  | 'duplicate-colour'
  | 'duplicate-glyph';

export interface MatrixProblem {
  code: MatrixProblemCode;
  message: string;
  /** Where the problem is, e.g. 'cells.C.2' or 'levels[1].colour'. */
  path: string;
}

export type MatrixKeyAxis = 'severity' | 'likelihood' | 'level' | 'cell';

/** A lookup asked for a key the matrix does not have. */
export class MatrixKeyError extends Error {
  readonly axis: MatrixKeyAxis;
  readonly key: string;

  constructor(axis: MatrixKeyAxis, key: string, matrixId: string) {
    super(`Matrix '${matrixId}' has no ${axis} '${key}'.`);
    this.name = 'MatrixKeyError';
    this.axis = axis;
    this.key = key;
  }
}

function checkEntries(
  entries: readonly { key: string; label: string }[],
  path: string,
  what: string,
): MatrixProblem[] {
  const problems: MatrixProblem[] = [];
  if (entries.length === 0) problems.push({ code: 'empty-axis', path, message: `The matrix has no ${what}.` });
  const seen = new Set<string>();
  entries.forEach((e, i) => {
    const at = `${path}[${i}]`;
    if (!e.key || !e.key.trim()) problems.push({ code: 'empty-key', path: `${at}.key`, message: `A ${what} entry has no key.` });
    if (!e.label || !e.label.trim()) problems.push({ code: 'empty-label', path: `${at}.label`, message: `${what} '${e.key}' has no label.` });
    if (seen.has(e.key)) problems.push({ code: 'duplicate-key', path: `${at}.key`, message: `${what} key '${e.key}' appears twice.` });
    seen.add(e.key);
  });
  return problems;
}

function checkLevelStyle(levels: readonly RiskLevel[]): MatrixProblem[] {
  const problems: MatrixProblem[] = [];
  const ranks = new Set<number>();
  levels.forEach((l, i) => {
    const at = `levels[${i}]`;
    if (!Number.isInteger(l.rank)) problems.push({ code: 'bad-rank', path: `${at}.rank`, message: `Level '${l.key}' needs a whole-number rank.` });
    else if (ranks.has(l.rank)) problems.push({ code: 'duplicate-rank', path: `${at}.rank`, message: `Two levels share rank ${l.rank}, so they cannot be ordered.` });
    ranks.add(l.rank);
    if (!isHexColour(l.colour)) problems.push({ code: 'bad-colour', path: `${at}.colour`, message: `Level '${l.key}' colour must be #rrggbb (got '${l.colour}').` });
    if (l.nightColour !== undefined && !isHexColour(l.nightColour)) {
      problems.push({ code: 'bad-colour', path: `${at}.nightColour`, message: `Level '${l.key}' night colour must be #rrggbb (got '${l.nightColour}').` });
    }
    if (l.glyph !== undefined && !(LEVEL_GLYPHS as readonly string[]).includes(l.glyph)) {
      problems.push({ code: 'bad-glyph', path: `${at}.glyph`, message: `Level '${l.key}' has an unknown glyph '${l.glyph}'.` });
    }
  });
  return problems;
}

function checkCells(m: RiskMatrix): MatrixProblem[] {
  const problems: MatrixProblem[] = [];
  const levelKeys = new Set(m.levels.map((l) => l.key));
  const sevKeys = new Set(m.severities.map((s) => s.key));
  const likKeys = new Set(m.likelihoods.map((l) => l.key));
  const cells = m.cells ?? {};
  for (const lik of m.likelihoods) {
    const row = cells[lik.key];
    if (!row) {
      problems.push({ code: 'missing-row', path: `cells.${lik.key}`, message: `Likelihood '${lik.key}' has no row of cells.` });
      continue;
    }
    for (const sev of m.severities) {
      const path = `cells.${lik.key}.${sev.key}`;
      const level = row[sev.key];
      if (level === undefined) problems.push({ code: 'missing-cell', path, message: `No level for likelihood '${lik.key}', severity '${sev.key}'.` });
      else if (!levelKeys.has(level)) problems.push({ code: 'unknown-level', path, message: `Cell uses level '${level}', which the matrix does not define.` });
    }
    for (const sevKey of Object.keys(row)) {
      if (!sevKeys.has(sevKey)) problems.push({ code: 'unknown-column', path: `cells.${lik.key}.${sevKey}`, message: `Cell for unknown severity '${sevKey}'.` });
    }
  }
  for (const likKey of Object.keys(cells)) {
    if (!likKeys.has(likKey)) problems.push({ code: 'unknown-row', path: `cells.${likKey}`, message: `Row for unknown likelihood '${likKey}'.` });
  }
  return problems;
}

/** Every problem with a matrix definition; an empty list means it is usable. */
export function validateMatrix(m: RiskMatrix): MatrixProblem[] {
  const problems: MatrixProblem[] = [];
  if (!m.id || !m.id.trim()) problems.push({ code: 'empty-id', path: 'id', message: 'The matrix needs an id.' });
  if (!m.name || !m.name.trim()) problems.push({ code: 'empty-name', path: 'name', message: 'The matrix needs a name.' });
  problems.push(...checkEntries(m.severities, 'severities', 'severity'));
  problems.push(...checkEntries(m.likelihoods, 'likelihoods', 'likelihood'));
  problems.push(...checkEntries(m.levels, 'levels', 'level'));
  problems.push(...checkLevelStyle(m.levels));
  problems.push(...checkCells(m));
  return problems;
}

/** The level definition for a key; throws MatrixKeyError if the matrix has none. */
export function getLevel(matrix: RiskMatrix, levelKey: string): RiskLevel {
  const level = matrix.levels.find((l) => l.key === levelKey);
  if (!level) throw new MatrixKeyError('level', levelKey, matrix.id);
  return level;
}

/** The risk level of one cell; throws MatrixKeyError for keys the matrix lacks. */
export function riskLevel(matrix: RiskMatrix, severity: string, likelihood: string): RiskLevel {
  if (!matrix.severities.some((s) => s.key === severity)) throw new MatrixKeyError('severity', severity, matrix.id);
  if (!matrix.likelihoods.some((l) => l.key === likelihood)) throw new MatrixKeyError('likelihood', likelihood, matrix.id);
  const levelKey = matrix.cells[likelihood]?.[severity];
  if (levelKey === undefined) throw new MatrixKeyError('cell', `${likelihood}${severity}`, matrix.id);
  return getLevel(matrix, levelKey);
}

/** Negative when a is less severe than b, 0 when equal, positive when worse (sort ascending = mildest first). */
export function compareLevels(matrix: RiskMatrix, a: string, b: string): number {
  return getLevel(matrix, a).rank - getLevel(matrix, b).rank;
}
