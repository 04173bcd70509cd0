/**
 * Looking ahead from the clock: when T-0 will come if nothing else stops the count, whether that is past the
 * firing window, and where the time went so far.
 */
import type { HoldCategory } from './events';
import { countedSteps, reachTimes } from './plan';
import { tAt, type CountState } from './state';

/**
 * The epoch ms T-0 is projected for: now, plus the count still to run (-T while T is negative), plus the
 * built-in holds still ahead before T-0, plus what is left of the built-in hold running now. During an
 * unplanned hold the clock stands, so the projection slides with now. Null when there will be no T-0 (a
 * count with no plan, scrubbed, or closed); once T-0 is reached, the instant it was.
 */
export function projectedT0(state: CountState, nowMs: number): number | null {
  const plan = state.plan;
  if (!plan || state.scrub) return null;
  if (state.t0At !== null) return state.t0At;
  if (state.status === 'safing' || state.status === 'complete') return null;
  const t = state.status === 'ready' ? plan.startTSeconds : tAt(state, nowMs);
  const times = reachTimes(plan);
  const ahead = countedSteps(plan)
    .filter((s) => s.kind === 'builtInHold' && state.steps[s.key]?.status === 'pending' && (times.get(s.key) ?? 0) <= 0)
    .reduce((sum, s) => sum + (s.durationSeconds ?? 0), 0);
  const current = state.builtInHold ? Math.max(0, state.builtInHold.startedAt + state.builtInHold.durationSeconds * 1000 - nowMs) : 0;
  return nowMs + Math.max(0, -t) * 1000 + ahead * 1000 + current;
}

export interface WindowWarning {
  projectedT0: number;
  windowEnd: number;
  /** How far past the window's end T-0 is projected, in whole seconds. */
  lateBySeconds: number;
}

/** A warning when projected T-0 falls after the end of the firing window; null when it fits or there is no window. */
export function windowWarning(state: CountState, nowMs: number): WindowWarning | null {
  const windowEnd = state.plan?.windowEnd ?? null;
  const projected = projectedT0(state, nowMs);
  if (windowEnd === null || projected === null || projected <= windowEnd) return null;
  return { projectedT0: projected, windowEnd, lateBySeconds: Math.ceil((projected - windowEnd) / 1000) };
}

export type HoldTimeKey = HoldCategory | 'built-in';

/**
 * Seconds on hold by category: each unplanned hold from its call to its clearing (or to now while open, or to
 * the end of the count), built-in holds under 'built-in'. Holds that overlap are each counted in full.
 */
export function holdTimeByCategory(state: CountState, nowMs: number): Partial<Record<HoldTimeKey, number>> {
  const out: Partial<Record<HoldTimeKey, number>> = {};
  const add = (key: HoldTimeKey, ms: number) => {
    out[key] = (out[key] ?? 0) + Math.max(0, ms) / 1000;
  };
  for (const h of state.holds) add(h.category, (h.clearedAt ?? h.endedAt ?? nowMs) - h.calledAt);
  for (const b of state.builtInHolds) add('built-in', (b.endedAt ?? nowMs) - b.startedAt);
  return out;
}
