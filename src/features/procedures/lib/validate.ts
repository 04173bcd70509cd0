/**
 * The editor's checks are the server's: the draft goes through the contract's revision schema, which runs
 * the domain rules (each step's own, the sequence, the team's stations and hazards), and every problem
 * comes back at its path ('phases.1.steps.3.tSeconds') for the field to show.
 */
import { revisionContentSchema } from '../../../contract/procedures';
import { draftToContent, type PhaseDraft } from './draft';

export type ProblemMap = ReadonlyMap<string, string>;

export interface DraftCheck {
  /** path -> the first message for it. */
  problems: ProblemMap;
  /** Every problem in list order, for the summary. */
  list: { path: string; message: string }[];
}

export function checkDraft(
  phases: readonly PhaseDraft[],
  refs: { stations: ReadonlySet<string>; hazardIds?: ReadonlySet<number> } | undefined,
): DraftCheck {
  const { phases: content, textProblems } = draftToContent(phases);
  const map = new Map<string, string>();
  const list: { path: string; message: string }[] = [];
  const add = (path: string, message: string) => {
    if (map.has(path)) return;
    map.set(path, message);
    list.push({ path, message });
  };
  // The text of a field comes first: "not a count time" says more than what the placeholder value broke.
  for (const p of textProblems) add(p.path, p.message);
  const result = revisionContentSchema(refs).safeParse({ phases: content });
  if (!result.success) for (const issue of result.error.issues) add(issue.path.map(String).join('.') || '(draft)', issue.message);
  list.sort((a, b) => comparePaths(a.path, b.path));
  return { problems: map, list };
}

/** Orders 'phases.0.steps.10.x' after 'phases.0.steps.9.x' (numbers compared as numbers). */
export function comparePaths(a: string, b: string): number {
  const pa = a.split('.');
  const pb = b.split('.');
  for (let i = 0; i < Math.max(pa.length, pb.length); i++) {
    const x = pa[i];
    const y = pb[i];
    if (x === undefined) return -1;
    if (y === undefined) return 1;
    if (x === y) continue;
    const nx = /^\d+$/.test(x) ? Number(x) : NaN;
    const ny = /^\d+$/.test(y) ? Number(y) : NaN;
    if (!Number.isNaN(nx) && !Number.isNaN(ny)) return nx - ny;
    return x < y ? -1 : 1;
  }
  return 0;
}

/** Problems of one step, keyed by field ('tSeconds', 'stations.1', ...). */
export function stepProblemsAt(problems: ProblemMap, phase: number, index: number): Map<string, string> {
  const prefix = `phases.${phase}.steps.${index}.`;
  const out = new Map<string, string>();
  for (const [path, message] of problems) if (path.startsWith(prefix)) out.set(path.slice(prefix.length), message);
  return out;
}

/** The first message for a field or any of its entries ('stations' also covers 'stations.2'). */
export function fieldProblem(problems: ReadonlyMap<string, string>, field: string): string | undefined {
  if (problems.has(field)) return problems.get(field);
  for (const [path, message] of problems) if (path.startsWith(`${field}.`)) return message;
  return undefined;
}

/**
 * The server's 400 details (paths into the body it was sent) as a problem map. Keys are positions, so they
 * only hold for the draft exactly as it was sent: the editor clears them at the next change.
 */
export function serverProblems(details: readonly { path: string; message: string }[]): Map<string, string> {
  const map = new Map<string, string>();
  for (const d of details) if (!map.has(d.path)) map.set(d.path, d.message);
  return map;
}
