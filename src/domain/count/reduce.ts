/**
 * The one function that turns a count's events into its state. The server's live state, the phone's view and
 * the auditor's replay all fold with it. Pure: it never reads a clock and never changes the state it is given.
 */
import type { CountEvent, CountEventOf, CountEventType } from './events';
import { countedSteps, reachTimes, safingSteps } from './plan';
import {
  initialCountState,
  isLive,
  tAt,
  type BuiltInHoldRecord,
  type ClosedPoll,
  type CountState,
  type HoldRecord,
  type StepState,
} from './state';

type Handler<T extends CountEventType> = (state: CountState, event: CountEventOf<T>) => CountState;

/** Move the clock's anchor to `at`, standing at `t` (default: wherever it reads then), running if the count is. */
function reclock(prev: CountState, next: CountState, at: number, t?: number): CountState {
  const tSeconds = t ?? tAt(prev, at);
  const running = next.status === 'counting' && next.builtInHold === null;
  return { ...next, clock: { tSeconds, anchorAt: at, running } };
}

/** The hold shown as blocking: the first still open in this hold period, else its last. */
function blockingHold(state: CountState): HoldRecord | null {
  if (state.status !== 'holding') return null;
  const period = state.holds.filter((h) => h.endedAt === null);
  return period.find((h) => !h.cleared) ?? period[period.length - 1] ?? null;
}

function withCurrentSteps(state: CountState): CountState {
  const current: Record<string, string[]> = {};
  for (const step of state.plan?.steps ?? []) {
    if (state.steps[step.key]?.status !== 'current') continue;
    (current[step.station] ??= []).push(step.key);
  }
  return { ...state, currentSteps: current };
}

function patchStep(state: CountState, key: string, patch: Partial<StepState>): CountState {
  const step = state.steps[key];
  if (!step) return state;
  return { ...state, steps: { ...state.steps, [key]: { ...step, ...patch } } };
}

function cancelPoll(state: CountState, at: number): CountState {
  if (!state.poll) return state;
  const closed: ClosedPoll = { ...state.poll, result: 'cancelled', nogo: [], missing: [], lost: [], closedAt: at };
  return { ...state, poll: null, polls: [...state.polls, closed] };
}

function endBuiltInHold(state: CountState, at: number, early: boolean): CountState {
  if (!state.builtInHold) return state;
  const key = state.builtInHold.stepKey;
  const builtInHolds = state.builtInHolds.map((b, i): BuiltInHoldRecord =>
    i === state.builtInHolds.length - 1 && b.endedAt === null ? { ...b, endedAt: at, early } : b,
  );
  return {
    ...state,
    builtInHold: null,
    builtInHolds,
    steps: state.steps[key] ? { ...state.steps, [key]: { ...state.steps[key], status: 'done', completedAt: at, completedBy: null } } : state.steps,
  };
}

/** Close the current hold period (at a resume or a scrub). */
function endHoldPeriod(state: CountState, at: number): CountState {
  return { ...state, holds: state.holds.map((h) => (h.endedAt === null ? { ...h, endedAt: at } : h)) };
}

function enterSafing(state: CountState, at: number): CountState {
  const plan = state.plan;
  if (!plan) return state;
  const steps = { ...state.steps };
  for (const s of safingSteps(plan)) {
    const cur = steps[s.key];
    if (cur && cur.status === 'pending') steps[s.key] = { ...cur, status: 'current', reachedAt: at };
  }
  return { ...state, steps };
}

const handlers: { [T in CountEventType]: Handler<T> } = {
  'count:created': (state, e) => {
    const plan = e.payload;
    const steps: Record<string, StepState> = {};
    for (const s of plan.steps) {
      steps[s.key] = { key: s.key, status: 'pending', reachedAt: null, completedAt: null, completedBy: null, readings: [], reopened: 0 };
    }
    const codes = new Set<string>([...plan.crew.map((c) => c.station), ...plan.steps.flatMap((s) => [s.station, ...s.stations])]);
    const stations: CountState['stations'] = {};
    for (const station of codes) stations[station] = { station, presence: 'unknown', since: null, lastAnswer: null };
    return { ...state, plan, steps, stations, clock: { tSeconds: plan.startTSeconds, anchorAt: null, running: false } };
  },

  'count:started': (state, e) => {
    if (!state.plan) return state;
    const from = e.payload.fromSeconds ?? state.plan.startTSeconds;
    let next: CountState = { ...state, status: 'counting', startedAt: e.at, startedAtT: from };
    if (from > state.plan.startTSeconds) {
      // Picked up later: every step due before that time is skipped, done without anyone doing it.
      const times = reachTimes(state.plan);
      const steps = { ...next.steps };
      for (const s of countedSteps(state.plan)) {
        const cur = steps[s.key];
        if (cur && cur.status === 'pending' && (times.get(s.key) ?? 0) < from) steps[s.key] = { ...cur, status: 'done', completedAt: e.at, skipped: true };
      }
      next = { ...next, steps };
    }
    return reclock(state, next, e.at, from);
  },

  'step:reached': (state, e) => patchStep(state, e.payload.stepKey, { status: 'current', reachedAt: e.at }),

  'step:completed': (state, e) =>
    patchStep(state, e.payload.stepKey, { status: 'done', completedAt: e.at, completedBy: e.actor }),

  'reading:recorded': (state, e) => {
    const step = state.steps[e.payload.stepKey];
    if (!step) return state;
    const { value, unit, inLimits, message } = e.payload;
    return patchStep(state, step.key, { readings: [...step.readings, { value, unit, inLimits, message, at: e.at, by: e.actor }] });
  },

  'poll:opened': (state, e) => ({
    ...state,
    poll: {
      pollId: e.payload.pollId,
      stepKey: e.payload.stepKey,
      question: e.payload.question,
      stations: [...e.payload.stations],
      timeoutSeconds: e.payload.timeoutSeconds,
      openedAt: e.at,
      openedBy: e.actor,
      answers: {},
    },
  }),

  'poll:answered': (state, e) => {
    const { pollId, station, answer, reason, responseMs } = e.payload;
    if (!state.poll || state.poll.pollId !== pollId) return state;
    const presence = state.stations[station] ?? { station, presence: 'unknown' as const, since: null, lastAnswer: null };
    return {
      ...state,
      poll: { ...state.poll, answers: { ...state.poll.answers, [station]: { station, answer, reason, responseMs, at: e.at, by: e.actor } } },
      stations: { ...state.stations, [station]: { ...presence, lastAnswer: { pollId, answer, at: e.at } } },
    };
  },

  'poll:closed': (state, e) => {
    if (!state.poll || state.poll.pollId !== e.payload.pollId) return state;
    const { result, nogo, missing, lost } = e.payload;
    const closed: ClosedPoll = { ...state.poll, result, nogo, missing, lost, closedAt: e.at };
    let next: CountState = { ...state, poll: null, polls: [...state.polls, closed] };
    const key = closed.stepKey;
    if (result === 'go' && key !== null && next.steps[key]?.status === 'current') {
      next = patchStep(next, key, { status: 'done', completedAt: e.at, completedBy: null });
    }
    return next;
  },

  'hold:called': (state, e) => {
    const hold: HoldRecord = {
      ...e.payload,
      calledBy: e.actor,
      calledAt: e.at,
      calledAtT: tAt(state, e.at),
      cleared: false,
      clearedAt: null,
      clearedBy: null,
      endedAt: null,
    };
    const next: CountState = { ...state, holds: [...state.holds, hold], status: isLive(state) ? 'holding' : state.status };
    return isLive(state) ? reclock(state, next, e.at) : next;
  },

  'hold:cleared': (state, e) => ({
    ...state,
    holds: state.holds.map((h) => (h.holdId === e.payload.holdId ? { ...h, cleared: true, clearedAt: e.at, clearedBy: e.actor } : h)),
  }),

  'builtInHold:started': (state, e) => {
    const { stepKey, durationSeconds } = e.payload;
    const t = state.plan ? reachTimes(state.plan).get(stepKey) : undefined;
    const next: CountState = {
      ...state,
      builtInHold: { stepKey, startedAt: e.at, durationSeconds },
      builtInHolds: [...state.builtInHolds, { stepKey, startedAt: e.at, durationSeconds, endedAt: null, early: false }],
    };
    // The clock stops exactly at the hold's own time, whatever millisecond the event landed on.
    return reclock(state, next, e.at, t);
  },

  'builtInHold:ended': (state, e) => {
    if (!state.builtInHold || state.builtInHold.stepKey !== e.payload.stepKey) return state;
    return reclock(state, endBuiltInHold(state, e.at, e.payload.early), e.at);
  },

  'count:resumed': (state, e) => {
    const next = endHoldPeriod({ ...state, status: 'counting' }, e.at);
    return reclock(state, next, e.at);
  },

  'count:recycled': (state, e) => {
    const plan = state.plan;
    if (!plan) return state;
    const { toSeconds, reason } = e.payload;
    const fromT = tAt(state, e.at);
    const times = reachTimes(plan);
    const steps = { ...state.steps };
    for (const s of countedSteps(plan)) {
      const cur = steps[s.key];
      if (!cur || cur.status === 'pending' || (times.get(s.key) ?? 0) <= toSeconds) continue;
      steps[s.key] = { ...cur, status: 'pending', reachedAt: null, completedAt: null, completedBy: null, readings: [], reopened: cur.reopened + 1 };
    }
    let next: CountState = {
      ...state,
      steps,
      recycles: [...state.recycles, { at: e.at, fromT, toT: toSeconds, reason, by: e.actor }],
      t0At: toSeconds < 0 ? null : state.t0At,
    };
    next = cancelPoll(next, e.at);
    if (next.builtInHold) {
      const key = next.builtInHold.stepKey;
      next = endBuiltInHold(next, e.at, true);
      // The built-in hold's step lies after the recycle point, so it comes round again.
      if ((times.get(key) ?? 0) > toSeconds) next = patchStep(next, key, { status: 'pending', reachedAt: null, completedAt: null });
    }
    return reclock(state, next, e.at, toSeconds);
  },

  'count:scrubbed': (state, e) => {
    const plan = state.plan;
    let next: CountState = {
      ...state,
      scrub: { at: e.at, atT: tAt(state, e.at), category: e.payload.category, reason: e.payload.reason, by: e.actor },
    };
    next = endHoldPeriod(cancelPoll(next, e.at), e.at);
    if (next.builtInHold) next = endBuiltInHold(next, e.at, true);
    next = enterSafing(next, e.at);
    next = { ...next, status: plan && safingSteps(plan).length > 0 ? 'safing' : 'scrubbed', closedAt: plan && safingSteps(plan).length > 0 ? null : e.at };
    return reclock(state, next, e.at);
  },

  'count:completed': (state, e) => {
    const plan = state.plan;
    let next: CountState = endHoldPeriod(cancelPoll({ ...state, completedAt: e.at }, e.at), e.at);
    next = enterSafing(next, e.at);
    const safing = plan !== null && safingSteps(plan).length > 0;
    next = { ...next, status: safing ? 'safing' : 'complete', closedAt: safing ? null : e.at };
    return reclock(state, next, e.at);
  },

  'count:safed': (state, e) => ({ ...state, status: state.scrub ? 'scrubbed' : 'complete', closedAt: e.at }),

  'station:connected': (state, e) => {
    const { station } = e.payload;
    const cur = state.stations[station] ?? { station, presence: 'unknown' as const, since: null, lastAnswer: null };
    return { ...state, stations: { ...state.stations, [station]: { ...cur, presence: 'connected', since: e.at } } };
  },

  'station:lost': (state, e) => {
    const { station } = e.payload;
    const cur = state.stations[station] ?? { station, presence: 'unknown' as const, since: null, lastAnswer: null };
    return { ...state, stations: { ...state.stations, [station]: { ...cur, presence: 'lost', since: e.at } } };
  },

  't0:reached': (state, e) => ({ ...state, t0At: e.at }),
};

/**
 * Fold one event. An event at or below the state's last seq is already in it and changes nothing, so a
 * client may fold a stream that overlaps what it has.
 */
export function reduce(state: CountState, event: CountEvent): CountState {
  if (event.seq <= state.lastSeq) return state;
  const handler = handlers[event.type] as Handler<CountEventType>;
  const handled = handler(state, event);
  // currentSteps follows the steps: recomputed only when an event replaced them (most events, answers and presence, do not).
  const next = handled.steps === state.steps && handled.plan === state.plan ? handled : withCurrentSteps(handled);
  return { ...next, hold: blockingHold(next), lastSeq: event.seq, lastAt: event.at };
}

export function replay(events: readonly CountEvent[], from: CountState = initialCountState()): CountState {
  return events.reduce(reduce, from);
}

/** The state as it was at `atMs`: the events up to that instant, folded. Read its clock with tAt(state, atMs). */
export function stateAt(events: readonly CountEvent[], atMs: number): CountState {
  return replay(events.filter((e) => e.at <= atMs));
}

export interface ReplayIndex {
  /** The same state as stateAt(events, atMs). */
  stateAt(atMs: number): CountState;
  /** The state after every event. */
  final: CountState;
}

/**
 * stateAt for many instants of one log (a replay scrubbed back and forth): the log is folded once and the state kept
 * after every `every` events, so each question folds at most `every` events from the kept state before it instead
 * of the whole log from the start. A count's events come in seq order with their instants in order too (the clock's
 * own events are never dated before the last event); a log whose instants go back is answered by stateAt itself.
 */
export function replayIndex(
  events: readonly CountEvent[],
  every = 200,
  /** Called with each event and the states before and after it, for a caller that wants the fold's steps too. */
  visit?: (event: CountEvent, before: CountState, after: CountState) => void,
): ReplayIndex {
  const kept: CountState[] = [initialCountState()];
  let state = kept[0]!;
  let ordered = true;
  events.forEach((e, i) => {
    if (i > 0 && e.at < events[i - 1]!.at) ordered = false;
    const before = state;
    state = reduce(state, e);
    visit?.(e, before, state);
    if ((i + 1) % every === 0) kept.push(state);
  });
  const final = state;
  if (!ordered) return { final, stateAt: (atMs) => stateAt(events, atMs) };
  return {
    final,
    stateAt(atMs) {
      // How many events happened at or before atMs: the first index whose instant is later.
      let lo = 0;
      let hi = events.length;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (events[mid]!.at <= atMs) lo = mid + 1;
        else hi = mid;
      }
      if (lo === events.length) return final;
      const from = Math.floor(lo / every);
      return replay(events.slice(from * every, lo), kept[from]!);
    },
  };
}
