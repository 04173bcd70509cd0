/**
 * A propellant caution edit in words: what was added, removed, reworded, re-sourced or moved, with the
 * before and after of each. Reads history lines written before sources were kept (PPE as plain strings,
 * cautions without a source) as well as current ones.
 */

export interface CautionItem {
  key: string;
  severity: 'warning' | 'caution';
  text: string;
  source: string;
}
export interface PpeEntry {
  text: string;
  source: string;
}
export interface CautionSnapshot {
  cautions: CautionItem[];
  ppe: PpeEntry[];
}

export interface CautionChange {
  /** What changed, e.g. "Warning added" or "PPE item moved". */
  what: string;
  /** The item as it was, in words; null when it did not exist. */
  before: string | null;
  /** The item as it is now, in words; null when it was removed. */
  after: string | null;
}

const NOT_RECORDED = 'not recorded';

function asSnapshot(value: unknown): CautionSnapshot {
  const v = (value && typeof value === 'object' ? value : {}) as { cautions?: unknown; ppe?: unknown };
  const cautions = Array.isArray(v.cautions)
    ? v.cautions
        .filter((c): c is Record<string, unknown> => !!c && typeof c === 'object')
        .map((c) => ({
          key: String(c.key ?? ''),
          severity: c.severity === 'caution' ? ('caution' as const) : ('warning' as const),
          text: String(c.text ?? ''),
          source: typeof c.source === 'string' && c.source ? c.source : NOT_RECORDED,
        }))
    : [];
  const ppe = Array.isArray(v.ppe)
    ? v.ppe.map((p) =>
        typeof p === 'string'
          ? { text: p, source: NOT_RECORDED }
          : { text: String((p as PpeEntry)?.text ?? ''), source: String((p as PpeEntry)?.source ?? NOT_RECORDED) },
      )
    : [];
  return { cautions, ppe };
}

const kindWord = (s: CautionItem['severity']) => (s === 'warning' ? 'Warning' : 'Caution');
export const describeCaution = (c: CautionItem) => `${kindWord(c.severity)}: ${c.text} (source: ${c.source})`;
export const describePpe = (p: PpeEntry) => `${p.text} (source: ${p.source})`;

/** Indexes (into `seq`) of one longest strictly increasing subsequence. */
function longestIncreasing(seq: readonly number[]): Set<number> {
  const tails: number[] = [];
  const prev: number[] = new Array(seq.length).fill(-1);
  seq.forEach((v, i) => {
    let lo = 0;
    let hi = tails.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (seq[tails[mid]] < v) lo = mid + 1;
      else hi = mid;
    }
    if (lo > 0) prev[i] = tails[lo - 1];
    tails[lo] = i;
  });
  const keep = new Set<number>();
  for (let i = tails.length ? tails[tails.length - 1] : -1; i >= 0; i = prev[i]) keep.add(i);
  return keep;
}

/**
 * Items both lists share that changed place, with 1-based positions. The fewest items are reported: those
 * outside the longest run that kept its relative order (moving one item up does not "move" the rest).
 */
function moves<T>(before: readonly T[], after: readonly T[], id: (x: T) => string): { item: T; from: number; to: number }[] {
  const shared = after.filter((x) => before.some((y) => id(y) === id(x)));
  const from = shared.map((x) => before.findIndex((y) => id(y) === id(x)));
  const kept = longestIncreasing(from);
  return shared
    .map((item, i) => ({ item, i }))
    .filter(({ i }) => !kept.has(i))
    .map(({ item, i }) => ({ item, from: from[i] + 1, to: after.findIndex((y) => id(y) === id(item)) + 1 }));
}

export function describeCautionEdit(beforeValue: unknown, afterValue: unknown): CautionChange[] {
  const before = asSnapshot(beforeValue);
  const after = asSnapshot(afterValue);
  const changes: CautionChange[] = [];

  for (const old of before.cautions) {
    const now = after.cautions.find((c) => c.key === old.key);
    if (!now) {
      changes.push({ what: `${kindWord(old.severity)} removed`, before: describeCaution(old), after: null });
      continue;
    }
    const parts: string[] = [];
    if (now.severity !== old.severity) parts.push(`changed from ${kindWord(old.severity).toLowerCase()} to ${kindWord(now.severity).toLowerCase()}`);
    if (now.text !== old.text) parts.push('reworded');
    if (now.source !== old.source) parts.push('source changed');
    if (parts.length) changes.push({ what: `${kindWord(now.severity)} ${parts.join(', ')}`, before: describeCaution(old), after: describeCaution(now) });
  }
  for (const now of after.cautions) {
    if (!before.cautions.some((c) => c.key === now.key)) changes.push({ what: `${kindWord(now.severity)} added`, before: null, after: describeCaution(now) });
  }
  for (const m of moves(before.cautions, after.cautions, (c) => c.key)) {
    changes.push({ what: `${kindWord(m.item.severity)} moved`, before: `Position ${m.from}: ${m.item.text}`, after: `Position ${m.to}: ${m.item.text}` });
  }

  // PPE items have no key: an item is the same item while its text is the same.
  for (const old of before.ppe) {
    const now = after.ppe.find((p) => p.text === old.text);
    if (!now) changes.push({ what: 'PPE item removed', before: describePpe(old), after: null });
    else if (now.source !== old.source) changes.push({ what: 'PPE item source changed', before: describePpe(old), after: describePpe(now) });
  }
  for (const now of after.ppe) {
    if (!before.ppe.some((p) => p.text === now.text)) changes.push({ what: 'PPE item added', before: null, after: describePpe(now) });
  }
  for (const m of moves(before.ppe, after.ppe, (p) => p.text)) {
    changes.push({ what: 'PPE item moved', before: `Position ${m.from}: ${m.item.text}`, after: `Position ${m.to}: ${m.item.text}` });
  }
  return changes;
}
