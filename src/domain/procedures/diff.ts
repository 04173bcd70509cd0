/**
 * What changed between two revisions: steps added, removed, changed (which fields) and moved. Steps are
 * matched by their stable key, phases by theirs. A step counts as moved when it changed phase or when its
 * order relative to the other kept steps changed; a step that only shifted because others were added or
 * removed around it is not moved.
 */
import type { Phase, Step } from './steps';

export interface StepPlace {
  phaseKey: string;
  phaseName: string;
  /** 0-based index within the phase. */
  index: number;
}

export interface StepChange {
  key: string;
  at: StepPlace;
  fields: string[];
  before: Record<string, unknown>;
  after: Record<string, unknown>;
}

export interface RevisionDiff {
  added: { key: string; at: StepPlace; step: Step }[];
  removed: { key: string; at: StepPlace; step: Step }[];
  changed: StepChange[];
  moved: { key: string; from: StepPlace; to: StepPlace; step: Step }[];
  phases: {
    added: { key: string; name: string }[];
    removed: { key: string; name: string }[];
    renamed: { key: string; from: string; to: string }[];
    moved: { key: string; name: string }[];
  };
  unchanged: number;
}

interface Located {
  step: Step;
  at: StepPlace;
  order: number;
}

function locate(phases: readonly Phase[]): Map<string, Located> {
  const out = new Map<string, Located>();
  let order = 0;
  for (const phase of phases) {
    phase.steps.forEach((step, index) => {
      out.set(step.key, { step, at: { phaseKey: phase.key, phaseName: phase.name, index }, order: order++ });
    });
  }
  return out;
}

/** Keys in `a` (in order) that are not on one longest common subsequence of `a` and `b`. */
function outOfOrder(a: readonly string[], b: readonly string[]): Set<string> {
  const n = a.length;
  const m = b.length;
  const len: number[][] = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(0));
  for (let i = n - 1; i >= 0; i--) {
    for (let j = m - 1; j >= 0; j--) {
      len[i]![j] = a[i] === b[j] ? len[i + 1]![j + 1]! + 1 : Math.max(len[i + 1]![j]!, len[i]![j + 1]!);
    }
  }
  const kept = new Set<string>();
  let i = 0;
  let j = 0;
  while (i < n && j < m) {
    if (a[i] === b[j]) {
      kept.add(a[i]!);
      i++;
      j++;
    } else if (len[i + 1]![j]! >= len[i]![j + 1]!) i++;
    else j++;
  }
  return new Set(a.filter((k) => !kept.has(k)));
}

const same = (x: unknown, y: unknown) => JSON.stringify(x) === JSON.stringify(y);

/** The fields of two versions of a step that differ, the key aside, in a stable order. */
export function changedFields(before: Step, after: Step): string[] {
  const names = [...new Set([...Object.keys(before), ...Object.keys(after)])].filter((f) => f !== 'key').sort();
  const b = before as unknown as Record<string, unknown>;
  const a = after as unknown as Record<string, unknown>;
  return names.filter((f) => !same(b[f], a[f]));
}

export function diffRevisions(from: readonly Phase[], to: readonly Phase[]): RevisionDiff {
  const a = locate(from);
  const b = locate(to);
  const diff: RevisionDiff = {
    added: [],
    removed: [],
    changed: [],
    moved: [],
    phases: { added: [], removed: [], renamed: [], moved: [] },
    unchanged: 0,
  };

  const fromPhases = new Map(from.map((p) => [p.key, p]));
  const toPhases = new Map(to.map((p) => [p.key, p]));
  for (const p of to) if (!fromPhases.has(p.key)) diff.phases.added.push({ key: p.key, name: p.name });
  for (const p of from) if (!toPhases.has(p.key)) diff.phases.removed.push({ key: p.key, name: p.name });
  for (const p of to) {
    const old = fromPhases.get(p.key);
    if (old && old.name !== p.name) diff.phases.renamed.push({ key: p.key, from: old.name, to: p.name });
  }
  const keptPhasesFrom = from.map((p) => p.key).filter((k) => toPhases.has(k));
  const keptPhasesTo = to.map((p) => p.key).filter((k) => fromPhases.has(k));
  for (const k of outOfOrder(keptPhasesTo, keptPhasesFrom)) diff.phases.moved.push({ key: k, name: toPhases.get(k)!.name });

  for (const [key, loc] of b) if (!a.has(key)) diff.added.push({ key, at: loc.at, step: loc.step });
  for (const [key, loc] of a) if (!b.has(key)) diff.removed.push({ key, at: loc.at, step: loc.step });

  const keptFrom = [...a.values()].filter((l) => b.has(l.step.key)).sort((x, y) => x.order - y.order).map((l) => l.step.key);
  const keptTo = [...b.values()].filter((l) => a.has(l.step.key)).sort((x, y) => x.order - y.order).map((l) => l.step.key);
  const reordered = outOfOrder(keptTo, keptFrom);

  for (const key of keptTo) {
    const was = a.get(key)!;
    const now = b.get(key)!;
    const fields = changedFields(was.step, now.step);
    const moved = was.at.phaseKey !== now.at.phaseKey || reordered.has(key);
    if (fields.length > 0) {
      const before: Record<string, unknown> = {};
      const after: Record<string, unknown> = {};
      for (const f of fields) {
        before[f] = (was.step as unknown as Record<string, unknown>)[f];
        after[f] = (now.step as unknown as Record<string, unknown>)[f];
      }
      diff.changed.push({ key, at: now.at, fields, before, after });
    }
    if (moved) diff.moved.push({ key, from: was.at, to: now.at, step: now.step });
    if (fields.length === 0 && !moved) diff.unchanged += 1;
  }
  return diff;
}
