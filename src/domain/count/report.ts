/**
 * The count report: what a count came to, computed from its log with the same reducer that ran it. Pure: the
 * events in, the report out; the server serves it, the report page draws it, the e-mail sends it.
 */
import { HOLD_CATEGORIES, type Actor, type CountEvent, type HoldCategory, type HoldSource } from './events';
import { countedSteps, reachTimes } from './plan';
import { replay, stateAt } from './reduce';
import { tAt, type CountStatus, type RecycleRecord, type ScrubRecord } from './state';

export interface ReportHold {
  holdId: string;
  category: HoldCategory;
  reason: string;
  source: HoldSource;
  calledBy: Actor | null;
  calledByStation: string | null;
  calledAt: number;
  calledAtT: number;
  clearedAt: number | null;
  /** From the call to the end of its hold period (the resume, a recycle's resume, or the scrub). */
  seconds: number;
}

export interface StationPollStats {
  station: string;
  /** Polls that asked this station. */
  asked: number;
  answered: number;
  nogo: number;
  /** Asked and never answered (including a station lost during the poll). */
  missed: number;
  medianResponseMs: number | null;
  maxResponseMs: number | null;
}

export interface ReportRedline {
  stepKey: string;
  station: string;
  instruction: string;
  value: number;
  unit: string;
  message: string;
  at: number;
  /** T when the reading was recorded. */
  t: number;
}

export interface CountReport {
  status: CountStatus;
  /** The procedure's name, as the plan froze it. */
  procedureName: string;
  startedAt: number | null;
  startedAtT: number | null;
  /** When T-0 would have come with no unplanned hold: the start, plus the count from its start time, plus the planned built-in holds. */
  plannedT0At: number | null;
  actualT0At: number | null;
  /** actual - planned, seconds; null until T-0 was reached. */
  slipSeconds: number | null;
  completedAt: number | null;
  closedAt: number | null;
  /** The end used for anything still running: the close, else the last event. */
  endAt: number | null;
  holds: {
    count: number;
    /** Seconds the count stood on unplanned holds, overlapping holds counted once. */
    totalSeconds: number;
    /** Seconds per category, each hold counted in full in its own category. */
    byCategory: Partial<Record<HoldCategory, number>>;
    list: ReportHold[];
  };
  builtInHolds: { count: number; totalSeconds: number };
  recycles: RecycleRecord[];
  polls: { count: number; passed: number; failed: number; cancelled: number; stations: StationPollStats[] };
  redlines: ReportRedline[];
  scrub: ScrubRecord | null;
  crew: { station: string; names: string[] }[];
  events: number;
  lastHash: string | null;
}

function median(values: number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** Length of the union of [start, end) intervals, in ms. */
function unionMs(intervals: [number, number][]): number {
  const sorted = intervals.filter(([a, b]) => b > a).sort((x, y) => x[0] - y[0]);
  let total = 0;
  let cur: [number, number] | null = null;
  for (const [a, b] of sorted) {
    if (cur && a <= cur[1]) cur[1] = Math.max(cur[1], b);
    else {
      if (cur) total += cur[1] - cur[0];
      cur = [a, b];
    }
  }
  if (cur) total += cur[1] - cur[0];
  return total;
}

export function countReport(events: readonly (CountEvent & { hash?: string })[]): CountReport {
  const state = replay(events as CountEvent[]);
  const plan = state.plan;
  const endAt = state.closedAt ?? state.lastAt;
  const end = endAt ?? 0;

  let plannedT0At: number | null = null;
  if (plan && state.startedAt !== null && state.startedAtT !== null) {
    const from = state.startedAtT;
    const times = reachTimes(plan);
    const builtIn = countedSteps(plan)
      .filter((s) => s.kind === 'builtInHold' && (times.get(s.key) ?? 0) >= from && (times.get(s.key) ?? 0) <= 0)
      .reduce((sum, s) => sum + (s.durationSeconds ?? 0), 0);
    plannedT0At = state.startedAt + (0 - from + builtIn) * 1000;
  }

  const list: ReportHold[] = state.holds.map((h) => ({
    holdId: h.holdId,
    category: h.category,
    reason: h.reason,
    source: h.source,
    calledBy: h.calledBy,
    calledByStation: h.calledByStation,
    calledAt: h.calledAt,
    calledAtT: h.calledAtT,
    clearedAt: h.clearedAt,
    seconds: Math.max(0, (h.endedAt ?? end) - h.calledAt) / 1000,
  }));
  const byCategory: Partial<Record<HoldCategory, number>> = {};
  for (const category of HOLD_CATEGORIES) {
    const seconds = list.filter((h) => h.category === category).reduce((sum, h) => sum + h.seconds, 0);
    if (seconds > 0 || list.some((h) => h.category === category)) byCategory[category] = seconds;
  }

  const polls = [...state.polls, ...(state.poll ? [{ ...state.poll, result: 'open' as const, missing: [] as string[], lost: [] as string[] }] : [])];
  const stationCodes = [...new Set(polls.flatMap((p) => p.stations))].sort();
  const stations: StationPollStats[] = stationCodes.map((station) => {
    const asked = polls.filter((p) => p.stations.includes(station));
    const answers = asked.map((p) => p.answers[station]).filter((a) => a !== undefined);
    const times = answers.map((a) => a.responseMs);
    return {
      station,
      asked: asked.length,
      answered: answers.length,
      nogo: answers.filter((a) => a.answer === 'nogo').length,
      missed: asked.filter((p) => p.result !== 'open' && p.result !== 'cancelled' && !p.answers[station]).length,
      medianResponseMs: median(times),
      maxResponseMs: times.length ? Math.max(...times) : null,
    };
  });

  const redlines: ReportRedline[] = [];
  for (const e of events) {
    if (e.type !== 'reading:recorded' || e.payload.inLimits) continue;
    const step = plan?.steps.find((s) => s.key === e.payload.stepKey);
    redlines.push({
      stepKey: e.payload.stepKey,
      station: step?.station ?? e.station ?? '',
      instruction: step?.instruction ?? e.payload.stepKey,
      value: e.payload.value,
      unit: e.payload.unit,
      message: e.payload.message,
      at: e.at,
      t: tAt(stateAt(events as CountEvent[], e.at), e.at),
    });
  }

  return {
    status: state.status,
    procedureName: plan?.name ?? '',
    startedAt: state.startedAt,
    startedAtT: state.startedAtT,
    plannedT0At,
    actualT0At: state.t0At,
    slipSeconds: plannedT0At !== null && state.t0At !== null ? (state.t0At - plannedT0At) / 1000 : null,
    completedAt: state.completedAt,
    closedAt: state.closedAt,
    endAt,
    holds: { count: list.length, totalSeconds: unionMs(state.holds.map((h) => [h.calledAt, h.endedAt ?? end])) / 1000, byCategory, list },
    builtInHolds: {
      count: state.builtInHolds.length,
      totalSeconds: state.builtInHolds.reduce((sum, b) => sum + Math.max(0, (b.endedAt ?? end) - b.startedAt), 0) / 1000,
    },
    recycles: state.recycles,
    polls: {
      count: polls.length,
      passed: state.polls.filter((p) => p.result === 'go').length,
      failed: state.polls.filter((p) => p.result === 'nogo').length,
      cancelled: state.polls.filter((p) => p.result === 'cancelled').length,
      stations,
    },
    redlines,
    scrub: state.scrub,
    crew: (plan?.crew ?? []).map((c) => ({ station: c.station, names: c.names })),
    events: events.length,
    lastHash: events.at(-1)?.hash ?? null,
  };
}
