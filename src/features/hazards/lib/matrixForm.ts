/**
 * The risk-matrix editor's values, their conversion to the contract's input, and the checks the server
 * runs (contract schema, validateMatrix, checkLevelPalette, checkAcceptanceMap), placed at the form field
 * each problem is about. Server answers go through the same path mapping.
 */
import { riskMatrixInputSchema, riskMatrixUpdateInputSchema, type RiskMatrixInput } from '../../../contract/hazards';
import { checkAcceptanceMap } from '../../../domain/hazards/acceptance';
import { LEVEL_GLYPHS, validateMatrix, type LevelGlyph, type RiskMatrix } from '../../../domain/hazards/matrix';
import { checkLevelPalette, LEVEL_PALETTE, swatchFor, withPaletteDefaults } from '../../../domain/hazards/palette';
import type { Role } from '../../../domain/people/roles';
import type { MatrixView } from './risk';

export interface AxisRowValues {
  /** Stable while the row is edited or moved, so cells follow their row and column. */
  uid: string;
  key: string;
  label: string;
  description: string;
}

export interface LevelRowValues {
  uid: string;
  label: string;
  /** Text while typed; a whole number, higher = worse. */
  rank: string;
  /** A palette swatch key, '' until chosen. */
  swatch: string;
  glyph: LevelGlyph | '';
  roles: Role[];
}

export interface MatrixFormValues {
  name: string;
  id: string;
  severities: AxisRowValues[];
  likelihoods: AxisRowValues[];
  levels: LevelRowValues[];
  /** cells[likelihoodUid][severityUid] = levelUid, '' when not chosen. */
  cells: Record<string, Record<string, string>>;
}

/** Roles offered as acceptance authorities; the auditor reads the record and never signs it. */
export const ACCEPTING_ROLES: readonly Role[] = ['safety', 'admin', 'conductor', 'operator'];

let counter = 0;
/** Letters first: react-hook-form reads a numeric path segment as an array index. */
export function newUid(prefix: string): string {
  counter += 1;
  return `${prefix}${counter}`;
}

/** A level's key, made from its name: "Very high" -> "very-high". */
export function levelKeyOf(label: string): string {
  return label
    .trim()
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 40)
    .replace(/-+$/, '');
}

/** A matrix id suggested from its name. */
export function matrixIdOf(name: string): string {
  const slug = levelKeyOf(name).slice(0, 63).replace(/-+$/, '');
  return slug.length >= 2 ? slug : '';
}

const axisRow = (prefix: string, key: string): AxisRowValues => ({ uid: newUid(prefix), key, label: '', description: '' });

export function blankAxisRow(kind: 'severity' | 'likelihood', existing: readonly AxisRowValues[]): AxisRowValues {
  const used = new Set(existing.map((r) => r.key));
  if (kind === 'severity') {
    let n = existing.length + 1;
    while (used.has(String(n))) n += 1;
    return axisRow('s', String(n));
  }
  const letters = 'ABCDEFGHIJ';
  const free = [...letters].find((l) => !used.has(l)) ?? '';
  return axisRow('l', free);
}

export function blankLevelRow(existing: readonly LevelRowValues[]): LevelRowValues {
  const usedSwatches = new Set(existing.map((l) => l.swatch));
  const usedGlyphs = new Set(existing.map((l) => l.glyph));
  const swatch = LEVEL_PALETTE.find((s) => !usedSwatches.has(s.key));
  const glyph = swatch && !usedGlyphs.has(swatch.glyph) ? swatch.glyph : (LEVEL_GLYPHS.find((g) => !usedGlyphs.has(g)) ?? '');
  const lowest = existing.reduce((min, l) => (/^-?\d+$/.test(l.rank.trim()) ? Math.min(min, Number(l.rank)) : min), Infinity);
  return { uid: newUid('v'), label: '', rank: Number.isFinite(lowest) ? String(lowest - 1) : '1', swatch: swatch?.key ?? '', glyph, roles: ['safety'] };
}

/** A blank 3 x 3 to start from: keys filled in, names and cells left to the team. */
export function blankMatrixForm(): MatrixFormValues {
  const severities = ['1', '2', '3'].map((k) => axisRow('s', k));
  const likelihoods = ['A', 'B', 'C'].map((k) => axisRow('l', k));
  const levels: LevelRowValues[] = [
    { uid: newUid('v'), label: 'High', rank: '3', swatch: 'crimson', glyph: 'octagon', roles: ['safety', 'admin'] },
    { uid: newUid('v'), label: 'Medium', rank: '2', swatch: 'ochre', glyph: 'diamond', roles: ['safety'] },
    { uid: newUid('v'), label: 'Low', rank: '1', swatch: 'pine', glyph: 'circle', roles: ['safety'] },
  ];
  return { name: '', id: '', severities, likelihoods, levels, cells: emptyCells(likelihoods, severities, {}) };
}

/** Every likelihood x severity pair present, keeping the choices already made. */
export function emptyCells(
  likelihoods: readonly AxisRowValues[],
  severities: readonly AxisRowValues[],
  cells: MatrixFormValues['cells'],
): MatrixFormValues['cells'] {
  const out: MatrixFormValues['cells'] = {};
  for (const l of likelihoods) {
    out[l.uid] = {};
    for (const s of severities) out[l.uid][s.uid] = cells[l.uid]?.[s.uid] ?? '';
  }
  return out;
}

/** An existing matrix as editor values (for editing it, or as a copy to start a new one from). */
export function matrixToForm(m: MatrixView, { copy = false }: { copy?: boolean } = {}): MatrixFormValues {
  const severities = m.severities.map((s) => ({ uid: newUid('s'), key: s.key, label: s.label, description: s.description ?? '' }));
  const likelihoods = m.likelihoods.map((l) => ({ uid: newUid('l'), key: l.key, label: l.label, description: l.description ?? '' }));
  const levels = m.levels.map((l): LevelRowValues => ({
    uid: newUid('v'),
    label: l.label,
    rank: String(l.rank),
    swatch: swatchFor(l.colour)?.key ?? '',
    glyph: l.glyph ?? '',
    roles: [...(m.acceptanceMap[l.key] ?? [])],
  }));
  const levelUid = new Map(m.levels.map((l, i) => [l.key, levels[i].uid]));
  const cells: MatrixFormValues['cells'] = {};
  m.likelihoods.forEach((l, li) => {
    const row: Record<string, string> = {};
    m.severities.forEach((s, si) => {
      row[severities[si].uid] = levelUid.get(m.cells[l.key]?.[s.key] ?? '') ?? '';
    });
    cells[likelihoods[li].uid] = row;
  });
  return {
    name: copy ? `Copy of ${m.name}`.slice(0, 120) : m.name,
    id: copy ? '' : m.id,
    severities,
    likelihoods,
    levels,
    cells,
  };
}

/** The contract's input for these values (the id is left out when editing). */
export function formToInput(v: MatrixFormValues): RiskMatrixInput {
  const keyOf = new Map(v.levels.map((l) => [l.uid, levelKeyOf(l.label)]));
  const axis = (rows: readonly AxisRowValues[]) =>
    rows.map((r) => ({ key: r.key.trim(), label: r.label.trim(), ...(r.description.trim() ? { description: r.description.trim() } : {}) }));
  const cells: Record<string, Record<string, string>> = {};
  for (const l of v.likelihoods) {
    const row = (cells[l.key.trim()] ??= {});
    for (const s of v.severities) {
      const chosen = v.cells[l.uid]?.[s.uid];
      if (chosen) row[s.key.trim()] = keyOf.get(chosen) ?? '';
    }
  }
  const acceptanceMap: Record<string, Role[]> = {};
  for (const l of v.levels) acceptanceMap[keyOf.get(l.uid)!] = [...l.roles];
  return {
    id: v.id.trim(),
    name: v.name.trim(),
    severities: axis(v.severities),
    likelihoods: axis(v.likelihoods),
    levels: v.levels.map((l) => {
      const swatch = LEVEL_PALETTE.find((s) => s.key === l.swatch);
      return {
        key: keyOf.get(l.uid)!,
        label: l.label.trim(),
        rank: /^-?\d+$/.test(l.rank.trim()) ? Number(l.rank.trim()) : Number.NaN,
        colour: swatch?.colour ?? '',
        ...(swatch ? { nightColour: swatch.nightColour } : {}),
        ...(l.glyph ? { glyph: l.glyph } : {}),
      };
    }),
    cells,
    acceptanceMap,
  };
}

/** The matrix these values describe, in the domain's shape (for previews and the domain checks). */
export function formToMatrix(v: MatrixFormValues): RiskMatrix {
  const input = formToInput(v);
  return {
    id: input.id || 'draft',
    name: input.name,
    severities: input.severities,
    likelihoods: input.likelihoods,
    levels: input.levels.map((l) => ({ ...l, glyph: l.glyph as LevelGlyph | undefined })),
    cells: input.cells,
  };
}

export type FieldErrors = Map<string, string>;

/**
 * The form field a server or domain path is about: 'levels[1].colour' -> 'levels.1.swatch',
 * 'cells.C.2' -> 'cells.<rowUid>.<colUid>', 'acceptanceMap.high' -> 'levels.<i>.roles'. Null when the
 * path names nothing on the form.
 */
export function fieldForPath(path: string, v: MatrixFormValues): string | null {
  const parts = path.replace(/\[(\d+)\]/g, '.$1').split('.').filter(Boolean);
  const [head, a, b] = parts;
  if (head === 'id' || head === 'name') return parts.length === 1 ? head : null;
  if (head === 'severities' || head === 'likelihoods') {
    if (a === undefined) return `${head}.root`;
    const i = Number(a);
    if (!Number.isInteger(i) || !v[head][i]) return null;
    return `${head}.${i}.${b === 'label' || b === 'description' ? b : 'key'}`;
  }
  if (head === 'levels') {
    if (a === undefined) return 'levels.root';
    const i = Number(a);
    if (!Number.isInteger(i) || !v.levels[i]) return null;
    const field = b === 'rank' ? 'rank' : b === 'colour' || b === 'nightColour' ? 'swatch' : b === 'glyph' ? 'glyph' : 'label';
    return `levels.${i}.${field}`;
  }
  if (head === 'cells') {
    const row = v.likelihoods.find((l) => l.key.trim() === a);
    if (!row) return null;
    const col = b === undefined ? v.severities[0] : v.severities.find((s) => s.key.trim() === b);
    return col ? `cells.${row.uid}.${col.uid}` : null;
  }
  if (head === 'acceptanceMap') {
    const i = a === undefined ? -1 : v.levels.findIndex((l) => levelKeyOf(l.label) === a);
    return i >= 0 ? `levels.${i}.roles` : null;
  }
  return null;
}

/** Places problems at their fields (first message per field wins); the rest are returned as general messages. */
export function placeProblems(problems: readonly { path: string; message: string }[], v: MatrixFormValues): { fields: FieldErrors; general: string[] } {
  const fields: FieldErrors = new Map();
  const general: string[] = [];
  for (const p of problems) {
    const field = fieldForPath(p.path, v);
    if (field === null) {
      if (!general.includes(p.message)) general.push(p.message);
    } else if (!fields.has(field)) fields.set(field, p.message);
  }
  return { fields, general };
}

/**
 * Everything the server would refuse, and a little more that only the form can see (a rank that is not a
 * number, a colour not chosen), as field paths with messages. Empty when the matrix can be sent.
 */
export function checkMatrixForm(v: MatrixFormValues, mode: 'create' | 'edit'): { fields: FieldErrors; general: string[] } {
  const problems: { path: string; message: string }[] = [];
  const names = new Map<string, number>();
  v.levels.forEach((l, i) => {
    const key = levelKeyOf(l.label);
    if (!l.label.trim()) problems.push({ path: `levels[${i}].label`, message: 'Enter a name' });
    else if (key && names.has(key)) problems.push({ path: `levels[${i}].label`, message: `Level ${names.get(key)! + 1} already has this name` });
    if (key && !names.has(key)) names.set(key, i);
    if (l.label.trim() && !key) problems.push({ path: `levels[${i}].label`, message: 'Use at least one plain letter or digit in the name' });
    if (!/^-?\d+$/.test(l.rank.trim())) problems.push({ path: `levels[${i}].rank`, message: 'Enter a whole number (higher means worse)' });
    if (!l.swatch) problems.push({ path: `levels[${i}].colour`, message: 'Choose a colour' });
    if (!l.glyph) problems.push({ path: `levels[${i}].glyph`, message: 'Choose a shape' });
  });
  // A cell left empty is the commonest slip: say it plainly at the cell.
  v.likelihoods.forEach((l) =>
    v.severities.forEach((s) => {
      if (!v.cells[l.uid]?.[s.uid]) problems.push({ path: `cells.${l.key.trim()}.${s.key.trim()}`, message: 'Choose a level for this cell' });
    }),
  );

  const input = formToInput(v);
  const parsed = mode === 'create' ? riskMatrixInputSchema.safeParse(input) : riskMatrixUpdateInputSchema.safeParse((({ id: _id, ...rest }) => rest)(input));
  if (!parsed.success) {
    for (const issue of parsed.error.issues) problems.push({ path: issue.path.map(String).join('.'), message: issue.message });
  }
  const matrix = formToMatrix(v);
  const levels = withPaletteDefaults(matrix.levels, LEVEL_GLYPHS);
  for (const p of validateMatrix({ ...matrix, levels })) problems.push(p);
  for (const p of checkLevelPalette(levels)) problems.push(p);
  for (const p of checkAcceptanceMap(input.acceptanceMap ?? {}, { ...matrix, levels })) {
    problems.push({ path: p.level ? `acceptanceMap.${p.level}` : 'acceptanceMap', message: p.message });
  }
  return placeProblems(problems, v);
}
