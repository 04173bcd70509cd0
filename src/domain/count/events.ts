/**
 * The live count as a log of facts. Every event is past tense and carries its own server timestamp (`at`,
 * epoch ms); the reducer reads time from nowhere else. The first event of every count is `count:created`,
 * which freezes the plan (steps, crew, terminal count, window) so a replay never depends on the procedure
 * tables as they are today.
 */
import type { StepKind } from '../procedures/steps';

export interface Actor {
  userId: number;
  name: string;
}

export const HOLD_CATEGORIES = ['weather', 'hardware', 'propellant', 'range', 'personnel', 'data', 'other'] as const;
export type HoldCategory = (typeof HOLD_CATEGORIES)[number];

export const HOLD_CATEGORY_LABELS: Readonly<Record<HoldCategory, string>> = {
  weather: 'Weather',
  hardware: 'Hardware',
  propellant: 'Propellant',
  range: 'Range',
  personnel: 'Personnel',
  data: 'Data',
  other: 'Other',
};

/** Who put the count on hold: a person, a failed poll, a reading past its redline, or a server restart. */
export const HOLD_SOURCES = ['person', 'poll', 'redline', 'restart'] as const;
export type HoldSource = (typeof HOLD_SOURCES)[number];

export type PollAnswerValue = 'go' | 'nogo';

/** A caution as plain data, frozen into the plan when the count is created. */
export interface PlanCaution {
  kind: 'warning' | 'caution' | 'note';
  text: string;
  /** Where it came from, in words: 'HZ-003', 'propellant lox', 'step note'. */
  source: string;
}

/** One step of the plan, flattened out of its phase. Fields that do not apply to the kind are null or empty. */
export interface PlanStep {
  key: string;
  phaseKey: string;
  phaseName: string;
  /** Position in the whole plan, from 0. */
  index: number;
  tSeconds: number | null;
  station: string;
  kind: StepKind;
  instruction: string;
  unit: string | null;
  min: number | null;
  max: number | null;
  /** The stations a poll step asks. */
  stations: string[];
  durationSeconds: number | null;
  cautions: PlanCaution[];
  ppe: string[];
}

export interface CrewStation {
  station: string;
  userIds: number[];
  names: string[];
}

export interface CountPlan {
  name: string;
  procedureId: number;
  revisionId: number;
  revisionNumber: number;
  steps: PlanStep[];
  /** Steps of these phases are not counted: they run after a scrub or after firing. */
  safingPhaseKeys: string[];
  crew: CrewStation[];
  /** Where the clock starts. */
  startTSeconds: number;
  /** A hold called at or after this T-time cannot resume: the count must recycle. */
  terminalCountSeconds: number;
  /** The usual recycle point, offered when a terminal-count hold must recycle. */
  recycleToSeconds: number;
  /** The end of the firing window (epoch ms), or null when there is none. */
  windowEnd: number | null;
  pollTimeoutSeconds: number;
}

type Empty = Record<string, never>;

export interface CountEventPayloads {
  'count:created': CountPlan;
  /** fromSeconds: the count picked up later than the plan's start; the steps before it are skipped. */
  'count:started': { fromSeconds?: number };
  'step:reached': { stepKey: string };
  'step:completed': { stepKey: string };
  'reading:recorded': { stepKey: string; value: number; unit: string; inLimits: boolean; message: string };
  'poll:opened': { pollId: string; stations: string[]; stepKey: string | null; question: string; timeoutSeconds: number };
  'poll:answered': { pollId: string; station: string; answer: PollAnswerValue; reason: string; responseMs: number };
  'poll:closed': {
    pollId: string;
    result: PollAnswerValue;
    nogo: { station: string; reason: string }[];
    missing: string[];
    /** Stations shown as lost when the poll closed: their answer cannot let it pass. */
    lost: string[];
  };
  'hold:called': { holdId: string; category: HoldCategory; reason: string; source: HoldSource; calledByStation: string | null };
  'hold:cleared': { holdId: string };
  'builtInHold:started': { stepKey: string; durationSeconds: number };
  'builtInHold:ended': { stepKey: string; early: boolean };
  'count:resumed': Empty;
  'count:recycled': { toSeconds: number; reason: string };
  'count:scrubbed': { category: HoldCategory; reason: string };
  /** Firing is over: the count moves to its safing steps. */
  'count:completed': Empty;
  /** Safing is done: the count is closed, as scrubbed or as complete. */
  'count:safed': Empty;
  'station:connected': { station: string };
  'station:lost': { station: string };
  't0:reached': Empty;
}

export type CountEventType = keyof CountEventPayloads;

export type CountEventOf<T extends CountEventType> = {
  seq: number;
  type: T;
  /** Server time, epoch ms. */
  at: number;
  /** The person behind the event; null for what the clock or the server did by itself. */
  actor: Actor | null;
  /** The station the actor acted for, when there is one. */
  station: string | null;
  payload: CountEventPayloads[T];
};

export type CountEvent = { [T in CountEventType]: CountEventOf<T> }[CountEventType];

/** An event before the server stores it: no seq yet; `at` only when the event must carry its own instant. */
export type EventDraft = { [T in CountEventType]: Omit<CountEventOf<T>, 'seq' | 'at'> & { at?: number } }[CountEventType];

/** A draft the clock made due: it always carries the exact instant it happened. */
export type DueDraft = EventDraft & { at: number };

export const COUNT_EVENT_TYPES: readonly CountEventType[] = [
  'count:created',
  'count:started',
  'step:reached',
  'step:completed',
  'reading:recorded',
  'poll:opened',
  'poll:answered',
  'poll:closed',
  'hold:called',
  'hold:cleared',
  'builtInHold:started',
  'builtInHold:ended',
  'count:resumed',
  'count:recycled',
  'count:scrubbed',
  'count:completed',
  'count:safed',
  'station:connected',
  'station:lost',
  't0:reached',
];

export function draft<T extends CountEventType>(
  type: T,
  payload: CountEventPayloads[T],
  who: { actor?: Actor | null; station?: string | null; at?: number } = {},
): EventDraft {
  const d = { type, payload, actor: who.actor ?? null, station: who.station ?? null } as EventDraft;
  return who.at === undefined ? d : { ...d, at: who.at };
}

/**
 * Stamp drafts as the server would: consecutive seqs after the state's last, `at` from the draft or `now`.
 * Tests and the client's optimistic view use the same numbering the store will give.
 */
export function stampEvents(lastSeq: number, drafts: readonly EventDraft[], now: number): CountEvent[] {
  return drafts.map((d, i) => ({ ...d, seq: lastSeq + 1 + i, at: d.at ?? now }) as CountEvent);
}
