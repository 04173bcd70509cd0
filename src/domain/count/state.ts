/**
 * What a count is at one instant, as the reducer folds it from the events. Plain JSON-safe data (records,
 * arrays, numbers, null), so the server can send it as it is and the client can fold further events onto it.
 */
import type { Actor, CountPlan, HoldCategory, HoldSource, PollAnswerValue } from './events';

export const COUNT_STATUSES = ['ready', 'counting', 'holding', 'safing', 'scrubbed', 'complete'] as const;
export type CountStatus = (typeof COUNT_STATUSES)[number];

/**
 * The count clock: T was `tSeconds` at `anchorAt` (epoch ms); while running, T grows by one second per second
 * of server time. Read it with `tAt`.
 */
export interface CountClock {
  tSeconds: number;
  anchorAt: number | null;
  running: boolean;
}

export interface HoldRecord {
  holdId: string;
  category: HoldCategory;
  reason: string;
  source: HoldSource;
  calledBy: Actor | null;
  calledByStation: string | null;
  calledAt: number;
  /** T when the hold was called. */
  calledAtT: number;
  cleared: boolean;
  clearedAt: number | null;
  clearedBy: Actor | null;
  /** When the count resumed (or was scrubbed) after this hold: the end of its hold period. */
  endedAt: number | null;
}

export interface ActiveBuiltInHold {
  stepKey: string;
  startedAt: number;
  durationSeconds: number;
}

export interface BuiltInHoldRecord extends ActiveBuiltInHold {
  endedAt: number | null;
  early: boolean;
}

export interface ReadingRecord {
  value: number;
  unit: string;
  inLimits: boolean;
  message: string;
  at: number;
  by: Actor | null;
}

export type StepStatus = 'pending' | 'current' | 'done';

export interface StepState {
  key: string;
  status: StepStatus;
  reachedAt: number | null;
  completedAt: number | null;
  /** Null when the step completed by itself: a poll that passed, a built-in hold that ended. */
  completedBy: Actor | null;
  readings: ReadingRecord[];
  /** How many times a recycle sent this step back to pending. */
  reopened: number;
  /** Done because the count was picked up after its time (a rehearsal from a later T), not because anyone did it. */
  skipped?: boolean;
}

export interface PollAnswer {
  station: string;
  answer: PollAnswerValue;
  reason: string;
  responseMs: number;
  at: number;
  by: Actor | null;
}

export interface OpenPoll {
  pollId: string;
  stepKey: string | null;
  question: string;
  stations: string[];
  timeoutSeconds: number;
  openedAt: number;
  openedBy: Actor | null;
  answers: Record<string, PollAnswer>;
}

export interface ClosedPoll extends OpenPoll {
  /** 'cancelled' when a recycle or a scrub overtook the poll. */
  result: PollAnswerValue | 'cancelled';
  nogo: { station: string; reason: string }[];
  missing: string[];
  lost: string[];
  closedAt: number;
}

export interface StationPresence {
  station: string;
  /** 'unknown' until the station first connects. */
  presence: 'unknown' | 'connected' | 'lost';
  since: number | null;
  lastAnswer: { pollId: string; answer: PollAnswerValue; at: number } | null;
}

export interface RecycleRecord {
  at: number;
  fromT: number;
  toT: number;
  reason: string;
  by: Actor | null;
}

export interface ScrubRecord {
  at: number;
  atT: number;
  category: HoldCategory;
  reason: string;
  by: Actor | null;
}

export interface CountState {
  plan: CountPlan | null;
  status: CountStatus;
  clock: CountClock;
  /** The hold that blocks the count now: the first still open, else the last of this hold period; null when not holding. */
  hold: HoldRecord | null;
  holds: HoldRecord[];
  builtInHold: ActiveBuiltInHold | null;
  builtInHolds: BuiltInHoldRecord[];
  steps: Record<string, StepState>;
  /** Keys of the steps reached and not done, by station, in plan order. */
  currentSteps: Record<string, string[]>;
  poll: OpenPoll | null;
  polls: ClosedPoll[];
  stations: Record<string, StationPresence>;
  recycles: RecycleRecord[];
  scrub: ScrubRecord | null;
  startedAt: number | null;
  /** T at the start: the plan's start, or the later time the count was picked up at. */
  startedAtT: number | null;
  t0At: number | null;
  /** When firing was declared over. */
  completedAt: number | null;
  /** When safing was closed and the count ended. */
  closedAt: number | null;
  lastSeq: number;
  lastAt: number | null;
}

export function initialCountState(): CountState {
  return {
    plan: null,
    status: 'ready',
    clock: { tSeconds: 0, anchorAt: null, running: false },
    hold: null,
    holds: [],
    builtInHold: null,
    builtInHolds: [],
    steps: {},
    currentSteps: {},
    poll: null,
    polls: [],
    stations: {},
    recycles: [],
    scrub: null,
    startedAt: null,
    startedAtT: null,
    t0At: null,
    completedAt: null,
    closedAt: null,
    lastSeq: 0,
    lastAt: null,
  };
}

/** T in seconds (fractional) at `nowMs`: it runs while the clock runs and stands still otherwise. */
export function tAt(state: Pick<CountState, 'clock'>, nowMs: number): number {
  const { tSeconds, anchorAt, running } = state.clock;
  if (!running || anchorAt === null) return tSeconds;
  return tSeconds + (nowMs - anchorAt) / 1000;
}

/** The holds not yet cleared, oldest first. */
export function openHolds(state: Pick<CountState, 'holds'>): HoldRecord[] {
  return state.holds.filter((h) => !h.cleared && h.endedAt === null);
}

/** Whether the count is live: started and neither closed nor in safing. */
export function isLive(state: Pick<CountState, 'status'>): boolean {
  return state.status === 'counting' || state.status === 'holding';
}
