/**
 * What the clock makes happen with no one pressing anything: steps reached as T passes their times, built-in
 * holds starting and ending, polls opening and timing out, T-0. The server asks `nextDueAt` to set one timer
 * and, when it fires (and before it decides any command), appends `dueEvents(state, now)`.
 *
 * Each due draft carries the exact instant it happened, so a server that wakes late (a busy machine, a
 * restart) catches up with every event at its own time and the clock stays exact.
 */
import { draft, stampEvents, type Actor, type DueDraft, type EventDraft, type PlanStep } from './events';
import { countedSteps, reachTimes } from './plan';
import { replay } from './reduce';
import { isLive, type CountState, type OpenPoll } from './state';

export interface PollOutcome {
  result: 'go' | 'nogo';
  nogo: { station: string; reason: string }[];
  missing: string[];
  lost: string[];
}

/**
 * How a poll comes out if it closes now: a no-go fails it, and so does a station that has not answered or
 * that shows as lost (a station the count cannot see cannot let a poll pass, whatever it said before).
 */
export function pollOutcome(poll: OpenPoll, stations: CountState['stations']): PollOutcome {
  const nogo: PollOutcome['nogo'] = [];
  const missing: string[] = [];
  const lost: string[] = [];
  for (const station of poll.stations) {
    const answer = poll.answers[station];
    if (answer?.answer === 'nogo') nogo.push({ station, reason: answer.reason });
    else if (stations[station]?.presence === 'lost') lost.push(station);
    else if (!answer) missing.push(station);
  }
  const failed = nogo.length + missing.length + lost.length > 0;
  return { result: failed ? 'nogo' : 'go', nogo, missing, lost };
}

/** 'poll failed: PROP no-go: vent valve slow; RANGE did not answer; LOX lost connection' */
export function pollFailureReason(outcome: PollOutcome): string {
  const parts = [
    ...outcome.nogo.map((n) => `${n.station} no-go: ${n.reason}`),
    ...outcome.missing.map((s) => `${s} did not answer`),
    ...outcome.lost.map((s) => `${s} lost connection`),
  ];
  return `poll failed: ${parts.join('; ')}`;
}

export function nextHoldId(state: CountState): string {
  return `h${state.holds.length + 1}`;
}

export function nextPollId(state: CountState): string {
  return `p${state.polls.length + (state.poll ? 1 : 0) + 1}`;
}

/** The drafts that close the open poll, and put the count on hold when it failed. */
export function closePollDrafts(state: CountState, at?: number): EventDraft[] {
  const poll = state.poll;
  if (!poll) return [];
  const outcome = pollOutcome(poll, state.stations);
  const out: EventDraft[] = [draft('poll:closed', { pollId: poll.pollId, ...outcome }, { at })];
  if (outcome.result === 'nogo' && isLive(state)) {
    out.push(
      draft(
        'hold:called',
        { holdId: nextHoldId(state), category: 'other', reason: pollFailureReason(outcome), source: 'poll', calledByStation: null },
        { at },
      ),
    );
  }
  return out;
}

export function pollOpenDraft(
  state: CountState,
  poll: { stations: string[]; stepKey: string | null; question: string; timeoutSeconds?: number },
  who: { actor?: Actor | null; station?: string | null; at?: number } = {},
): EventDraft {
  return draft(
    'poll:opened',
    {
      pollId: nextPollId(state),
      stations: poll.stations,
      stepKey: poll.stepKey,
      question: poll.question,
      timeoutSeconds: poll.timeoutSeconds ?? state.plan?.pollTimeoutSeconds ?? 60,
    },
    who,
  );
}

function hasPolled(state: CountState, key: string): boolean {
  const reachedAt = state.steps[key]?.reachedAt ?? null;
  if (state.poll?.stepKey === key) return true;
  return state.polls.some((p) => p.stepKey === key && reachedAt !== null && p.openedAt >= reachedAt);
}

function reachDrafts(state: CountState, step: PlanStep): EventDraft[] {
  const out: EventDraft[] = [draft('step:reached', { stepKey: step.key })];
  if (step.kind === 'builtInHold') {
    out.push(draft('builtInHold:started', { stepKey: step.key, durationSeconds: step.durationSeconds ?? 0 }));
  } else if (step.kind === 'poll' && !state.poll) {
    out.push(pollOpenDraft(state, { stations: step.stations, stepKey: step.key, question: step.instruction }));
  }
  return out;
}

/** The next thing the clock makes happen; its drafts are made only for the one that wins (see dueDrafts). */
type Due = { at: number } & (
  | { kind: 'poll-timeout' }
  | { kind: 'built-in-hold-end'; stepKey: string }
  | { kind: 'waiting-poll'; step: PlanStep }
  | { kind: 'step'; step: PlanStep }
  | { kind: 't0' }
);

/** The instant the running clock reads `t`, never before its anchor or the last event. */
function instantOf(clock: CountState['clock'], anchorAt: number, t: number, floor: number): number {
  return Math.max(Math.round(anchorAt + (t - clock.tSeconds) * 1000), anchorAt, floor);
}

const earlier = (best: Due | null, next: Due): Due => (best === null || next.at < best.at ? next : best);

/** The earliest thing the clock will make happen from this state, whenever that is. */
function nextDue(state: CountState): Due | null {
  const plan = state.plan;
  // In safing the clock stands still, but a safing poll still times out.
  if (!plan || (!isLive(state) && !(state.status === 'safing' && state.poll))) return null;
  const floor = state.lastAt ?? 0;
  let best: Due | null = null;

  if (state.poll) best = earlier(best, { at: state.poll.openedAt + state.poll.timeoutSeconds * 1000, kind: 'poll-timeout' });
  if (state.builtInHold) {
    const { stepKey, startedAt, durationSeconds } = state.builtInHold;
    best = earlier(best, { at: startedAt + durationSeconds * 1000, kind: 'built-in-hold-end', stepKey });
  }
  if (!state.poll && isLive(state)) {
    // A poll step reached while another poll was open asks its question as soon as that one closes.
    const waiting = countedSteps(plan).find((s) => s.kind === 'poll' && state.steps[s.key]?.status === 'current' && !hasPolled(state, s.key));
    if (waiting) best = earlier(best, { at: floor, kind: 'waiting-poll', step: waiting });
  }
  const { clock } = state;
  if (clock.running && clock.anchorAt !== null) {
    const step = countedSteps(plan).find((s) => state.steps[s.key]?.status === 'pending');
    const stepT = step ? reachTimes(plan).get(step.key)! : null;
    const stepDue: Due | null = step && stepT !== null ? { at: instantOf(clock, clock.anchorAt, stepT, floor), kind: 'step', step } : null;
    const t0Due: Due | null = state.t0At === null ? { at: instantOf(clock, clock.anchorAt, 0, floor), kind: 't0' } : null;
    // At the same instant, steps at or before T-0 come before T-0 itself (the first of equals wins).
    const ordered = stepT !== null && stepT > 0 ? [t0Due, stepDue] : [stepDue, t0Due];
    for (const d of ordered) if (d) best = earlier(best, d);
  }
  return best;
}

function dueDrafts(state: CountState, due: Due): EventDraft[] {
  switch (due.kind) {
    case 'poll-timeout':
      return closePollDrafts(state);
    case 'built-in-hold-end':
      return [draft('builtInHold:ended', { stepKey: due.stepKey, early: false })];
    case 'waiting-poll':
      return [pollOpenDraft(state, { stations: due.step.stations, stepKey: due.step.key, question: due.step.instruction })];
    case 'step':
      return reachDrafts(state, due.step);
    case 't0':
      return [draft('t0:reached', {})];
  }
}

/** The epoch ms of the next moment the clock makes something happen, or null when nothing is coming. */
export function nextDueAt(state: CountState): number | null {
  return nextDue(state)?.at ?? null;
}

/** Every event the clock has made due up to `nowMs`, in order, each with its own exact `at`. */
export function dueEvents(state: CountState, nowMs: number): DueDraft[] {
  const out: DueDraft[] = [];
  let s = state;
  // Each round settles at least one step, poll or hold, so the plan's size bounds the rounds; the guard is a backstop.
  for (let guard = 0; guard < 100_000; guard++) {
    const next = nextDue(s);
    if (!next || next.at > nowMs) break;
    const stamped = dueDrafts(s, next).map((d): DueDraft => ({ ...d, at: next.at }));
    out.push(...stamped);
    s = replay(stampEvents(s.lastSeq, stamped, next.at), s);
  }
  return out;
}

/**
 * After a server restart nobody could see a live count while it was down: hold it, so the crew looks before
 * the clock runs on. Nothing for a count that is not live or already holding. Append after the catch-up.
 */
export function restartHoldDrafts(state: CountState): EventDraft[] {
  if (state.status !== 'counting') return [];
  return [
    draft('hold:called', {
      holdId: nextHoldId(state),
      category: 'other',
      reason: 'control server restarted',
      source: 'restart',
      calledByStation: null,
    }),
  ];
}
