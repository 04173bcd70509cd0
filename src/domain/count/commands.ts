/**
 * Commands: what a person asks of the count. `decide` checks the ask against the state and who is asking and
 * answers with the facts to append, or a refusal a person can act on. The server appends `dueEvents` first,
 * so the state it decides on is the count as it stands at `ctx.now`.
 */
import type { Role } from '../people/roles';
import { formatDuration, formatTMinus } from '../procedures/tminus';
import { closePollDrafts, nextHoldId, pollOpenDraft } from './due';
import { draft, stampEvents, type Actor, type EventDraft, type HoldCategory, type PlanStep, type PollAnswerValue } from './events';
import { reachTimes, safingSteps, stepLabel } from './plan';
import { replay } from './reduce';
import { isLive, openHolds, tAt, type CountState, type HoldRecord } from './state';

export type CountCommand =
  | { type: 'count:start'; fromSeconds?: number }
  | { type: 'poll:open'; question?: string; stations?: string[]; stepKey?: string | null; timeoutSeconds?: number }
  | { type: 'poll:answer'; pollId: string; station: string; answer: PollAnswerValue; reason?: string }
  | { type: 'hold:call'; category: HoldCategory; reason: string; station?: string }
  | { type: 'hold:clear'; holdId: string }
  | { type: 'count:resume' }
  | { type: 'count:recycle'; toSeconds?: number; reason: string }
  | { type: 'count:scrub'; category: HoldCategory; reason: string }
  | { type: 'step:complete'; stepKey: string }
  | { type: 'reading:record'; stepKey: string; value: number }
  | { type: 'builtInHold:release' }
  | { type: 'count:complete' }
  | { type: 'count:close-safing' };

export type CountCommandType = CountCommand['type'];

export interface CommandContext {
  /** Server time, epoch ms. */
  now: number;
  actor: Actor & { roles: readonly Role[] };
  /** The stations this person mans in this count. */
  mannedStations: readonly string[];
}

export type Decision = { ok: true; events: EventDraft[] } | { ok: false; status: 400 | 403 | 409; error: string };

const refuse = (status: 400 | 403 | 409, error: string): Decision => ({ ok: false, status, error });
const accept = (events: EventDraft[]): Decision => ({ ok: true, events });

function t(seconds: number): string {
  return formatTMinus(Math.round(seconds));
}

function holdLabel(h: HoldRecord): string {
  return `${h.holdId} (${h.calledByStation ? `${h.calledByStation}: ` : ''}${h.reason})`;
}

/** 'above 14' / 'below 2', or null when the value is in limits. */
export function redlineBreach(step: Pick<PlanStep, 'min' | 'max'>, value: number): string | null {
  if (step.max !== null && value > step.max) return `above ${step.max}`;
  if (step.min !== null && value < step.min) return `below ${step.min}`;
  return null;
}

/** 'redline: LOX tank pressure: 14.6 bar above 14' */
export function redlineReason(step: Pick<PlanStep, 'min' | 'max' | 'unit' | 'instruction' | 'key'>, value: number): string | null {
  const breach = redlineBreach(step, value);
  return breach === null ? null : `redline: ${stepLabel(step)}: ${value} ${step.unit ?? ''} ${breach}`.replace(/\s+/g, ' ');
}

function limitsText(step: Pick<PlanStep, 'min' | 'max' | 'unit'>): string {
  const unit = step.unit ?? '';
  if (step.min !== null && step.max !== null) return `${step.min} to ${step.max} ${unit}`.trim();
  if (step.max !== null) return `at most ${step.max} ${unit}`.trim();
  return `at least ${step.min} ${unit}`.trim();
}

function notYoursRefusal(ctx: CommandContext, station: string, what: string): Decision {
  const yours = ctx.mannedStations.length > 0 ? `you man ${ctx.mannedStations.join(', ')}` : 'you man no station in this count';
  return refuse(403, `${what} belongs to ${station}; ${yours}.`);
}

/** A station's GO or NO-GO; the last answer of a poll also closes it. */
function decideAnswer(state: CountState, command: Extract<CountCommand, { type: 'poll:answer' }>, ctx: CommandContext): Decision {
  const poll = state.poll;
  if (!poll) return refuse(409, 'No poll is open: the poll has closed.');
  if (poll.pollId !== command.pollId) return refuse(409, `Poll ${command.pollId} has closed; poll ${poll.pollId} is open now.`);
  if (!poll.stations.includes(command.station)) return refuse(400, `${command.station} is not asked in this poll.`);
  if (!ctx.mannedStations.includes(command.station)) return notYoursRefusal(ctx, command.station, 'That answer');
  const reason = command.reason?.trim() ?? '';
  if (command.answer === 'nogo' && reason === '') return refuse(400, `Say why ${command.station} is no-go.`);
  const answer = draft(
    'poll:answered',
    { pollId: poll.pollId, station: command.station, answer: command.answer, reason, responseMs: Math.max(0, ctx.now - poll.openedAt) },
    { actor: { userId: ctx.actor.userId, name: ctx.actor.name }, station: command.station },
  );
  const allIn = poll.stations.every((s) => s === command.station || poll.answers[s] !== undefined);
  if (!allIn) return accept([answer]);
  // The last answer: the poll closes on the state that holds it.
  const after = replay(stampEvents(state.lastSeq, [answer], ctx.now), state);
  return accept([answer, ...closePollDrafts(after)]);
}

export function decide(state: CountState, command: CountCommand, ctx: CommandContext): Decision {
  const plan = state.plan;
  if (!plan) return refuse(409, 'This count has no plan yet.');
  if (state.status === 'scrubbed' || state.status === 'complete') {
    return refuse(409, `The count is over (${state.status}): nothing more can be done in it.`);
  }
  // Answers are most of a poll's commands: decided apart, without the helpers the other commands share.
  if (command.type === 'poll:answer') return decideAnswer(state, command, ctx);
  const roles = ctx.actor.roles;
  const isConductor = roles.includes('conductor');
  const isSafety = roles.includes('safety');
  const mans = (station: string) => ctx.mannedStations.includes(station);
  const actor: Actor = { userId: ctx.actor.userId, name: ctx.actor.name };
  const as = (station: string | null = null) => ({ actor, station });
  const conductorOnly = (what: string) => (isConductor ? null : refuse(403, `Only the test conductor ${what}.`));
  const mustBeLive = (): Decision | null => {
    if (isLive(state)) return null;
    if (state.status === 'ready') return refuse(409, 'The count has not started yet.');
    return refuse(409, 'The count is in safing: only safing steps remain.');
  };
  const stepOf = (key: string) => plan.steps.find((s) => s.key === key);
  const notCurrent = (step: PlanStep): Decision | null => {
    const st = state.steps[step.key];
    if (st?.status === 'current') return null;
    if (st?.status === 'done') return refuse(409, `"${stepLabel(step)}" is already done.`);
    const at = reachTimes(plan).get(step.key);
    return refuse(409, `"${stepLabel(step)}" has not been reached yet${at !== undefined ? `: it comes at ${t(at)}` : ''}.`);
  };
  const notYours = (station: string, what: string): Decision | null => (mans(station) ? null : notYoursRefusal(ctx, station, what));

  switch (command.type) {
    case 'count:start': {
      const no = conductorOnly('starts the count');
      if (no) return no;
      if (state.status !== 'ready') return refuse(409, 'The count has already started.');
      const from = command.fromSeconds;
      if (from === undefined || from === plan.startTSeconds) return accept([draft('count:started', {}, as())]);
      if (!Number.isInteger(from) || from < plan.startTSeconds || from >= 0) {
        return refuse(400, `Pick the count up between ${t(plan.startTSeconds)} and T-0:01.`);
      }
      return accept([draft('count:started', { fromSeconds: from }, as())]);
    }

    case 'poll:open': {
      // In safing too: a safing phase may end with a go/no-go (to open the range); the conductor asks it when ready.
      const no = conductorOnly('opens a go/no-go poll') ?? (state.status === 'safing' ? null : mustBeLive());
      if (no) return no;
      if (state.poll) {
        const left = Math.max(0, Math.ceil((state.poll.openedAt + state.poll.timeoutSeconds * 1000 - ctx.now) / 1000));
        return refuse(409, `Poll ${state.poll.pollId} is still open: wait for its answers or its timeout (${formatDuration(left)} left).`);
      }
      let step: PlanStep | undefined;
      if (command.stepKey) {
        step = stepOf(command.stepKey);
        if (!step || step.kind !== 'poll') return refuse(400, `There is no poll step ${command.stepKey} in this count.`);
        const nc = notCurrent(step);
        if (nc) return nc;
      }
      const stations = command.stations ?? (step ? step.stations : plan.crew.map((c) => c.station));
      if (stations.length === 0) return refuse(400, 'Name the stations the poll asks.');
      const unknown = stations.filter((s) => !state.stations[s]);
      if (unknown.length > 0) return refuse(400, `${unknown.join(', ')} ${unknown.length === 1 ? 'is' : 'are'} not a station of this count.`);
      const timeout = command.timeoutSeconds ?? plan.pollTimeoutSeconds;
      if (!Number.isInteger(timeout) || timeout < 5 || timeout > 3600) return refuse(400, 'A poll times out after 5 seconds to an hour.');
      const question = command.question?.trim() || step?.instruction || 'Go/no-go to continue the count?';
      return accept([pollOpenDraft(state, { stations: [...new Set(stations)], stepKey: step?.key ?? null, question, timeoutSeconds: timeout }, as())]);
    }

    case 'hold:call': {
      if (!isConductor && !isSafety && ctx.mannedStations.length === 0) {
        return refuse(403, 'Only the crew can call a hold: you are watching this count.');
      }
      if (command.station !== undefined && !mans(command.station)) return refuse(403, `You do not man ${command.station} in this count.`);
      const no = mustBeLive();
      if (no) return no;
      const reason = command.reason.trim();
      if (reason === '') return refuse(400, 'Say why you are calling the hold.');
      const station = command.station ?? ctx.mannedStations[0] ?? null;
      return accept([
        draft('hold:called', { holdId: nextHoldId(state), category: command.category, reason, source: 'person', calledByStation: station }, as(station)),
      ]);
    }

    case 'hold:clear': {
      const hold = state.holds.find((h) => h.holdId === command.holdId);
      if (!hold) return refuse(409, `There is no hold ${command.holdId} in this count.`);
      if (hold.cleared) return refuse(409, `Hold ${hold.holdId} is already cleared.`);
      if (hold.endedAt !== null) return refuse(409, `Hold ${hold.holdId} has ended with the count.`);
      let allowed: boolean;
      let who: string;
      if (hold.source !== 'person') {
        allowed = isConductor || isSafety;
        who = 'the test conductor or the safety officer';
      } else if (hold.calledByStation !== null) {
        allowed = isSafety || mans(hold.calledByStation);
        who = `someone manning ${hold.calledByStation}, which called it, or the safety officer`;
      } else {
        allowed = isSafety || hold.calledBy?.userId === ctx.actor.userId;
        who = `${hold.calledBy?.name ?? 'the person who called it'} or the safety officer`;
      }
      if (!allowed) return refuse(403, `Only ${who} can clear hold ${hold.holdId}.`);
      const station = hold.calledByStation !== null && mans(hold.calledByStation) ? hold.calledByStation : null;
      return accept([draft('hold:cleared', { holdId: hold.holdId }, as(station))]);
    }

    case 'count:resume': {
      const no = conductorOnly('resumes the count');
      if (no) return no;
      if (state.status !== 'holding') return refuse(409, 'The count is not holding.');
      const open = openHolds(state);
      if (open.length > 0) {
        return refuse(409, `Clear every hold first: ${open.map(holdLabel).join('; ')} ${open.length === 1 ? 'is' : 'are'} still open.`);
      }
      const standing = state.clock.tSeconds;
      if (standing >= plan.terminalCountSeconds) {
        const to = Math.min(plan.recycleToSeconds, Math.floor(standing));
        return refuse(
          409,
          `The count held at ${t(standing)}, inside terminal count (from ${t(plan.terminalCountSeconds)}): it cannot resume from there. Recycle to ${t(to)} or earlier, then resume.`,
        );
      }
      return accept([draft('count:resumed', {}, as())]);
    }

    case 'count:recycle': {
      const no = conductorOnly('recycles the count');
      if (no) return no;
      if (state.status !== 'holding') return refuse(409, 'Call a hold before recycling: the clock must stand still.');
      const reason = command.reason.trim();
      if (reason === '') return refuse(400, 'Say why the count recycles.');
      const to = command.toSeconds ?? plan.recycleToSeconds;
      const now = tAt(state, ctx.now);
      if (!Number.isInteger(to)) return refuse(400, 'A recycle goes back to a whole second.');
      if (to > now) return refuse(400, `${t(to)} is later than the clock (${t(now)}): recycle to ${t(Math.floor(now))} or earlier.`);
      if (to < plan.startTSeconds) return refuse(400, `The count starts at ${t(plan.startTSeconds)}: recycle to that or later.`);
      return accept([draft('count:recycled', { toSeconds: to, reason }, as())]);
    }

    case 'count:scrub': {
      if (!isConductor && !isSafety) return refuse(403, 'Only the test conductor or the safety officer scrubs the count.');
      if (state.status === 'safing') return refuse(409, 'The count is already in safing.');
      const reason = command.reason.trim();
      if (reason === '') return refuse(400, 'Say why the count is scrubbed.');
      return accept([draft('count:scrubbed', { category: command.category, reason }, as())]);
    }

    case 'step:complete': {
      const step = stepOf(command.stepKey);
      if (!step) return refuse(400, `There is no step ${command.stepKey} in this count.`);
      if (step.kind === 'reading') return refuse(400, `Record the reading for "${stepLabel(step)}": the step completes when it is in limits.`);
      if (step.kind === 'poll') return refuse(400, `"${stepLabel(step)}" completes when its go/no-go poll passes.`);
      if (step.kind === 'builtInHold') return refuse(400, 'A built-in hold ends by itself, or the test conductor releases it early.');
      const no = notYours(step.station, `"${stepLabel(step)}"`) ?? notCurrent(step);
      if (no) return no;
      return accept([draft('step:completed', { stepKey: step.key }, as(step.station))]);
    }

    case 'reading:record': {
      const step = stepOf(command.stepKey);
      if (!step || step.kind !== 'reading') return refuse(400, `There is no reading step ${command.stepKey} in this count.`);
      if (!Number.isFinite(command.value)) return refuse(400, 'A reading is a number.');
      const no = notYours(step.station, `"${stepLabel(step)}"`) ?? notCurrent(step);
      if (no) return no;
      const unit = step.unit ?? '';
      const breach = redlineBreach(step, command.value);
      const message = breach === null ? `${command.value} ${unit}, within ${limitsText(step)}`.replace(/\s+/g, ' ') : `${command.value} ${unit} ${breach}`.replace(/\s+/g, ' ');
      const reading = draft('reading:recorded', { stepKey: step.key, value: command.value, unit, inLimits: breach === null, message }, as(step.station));
      if (breach === null) return accept([reading, draft('step:completed', { stepKey: step.key }, as(step.station))]);
      if (!isLive(state)) return accept([reading]);
      const hold = draft(
        'hold:called',
        { holdId: nextHoldId(state), category: 'hardware', reason: redlineReason(step, command.value)!, source: 'redline', calledByStation: step.station },
        as(step.station),
      );
      return accept([reading, hold]);
    }

    case 'builtInHold:release': {
      const no = conductorOnly('releases a built-in hold early');
      if (no) return no;
      if (!state.builtInHold) return refuse(409, 'No built-in hold is running.');
      return accept([draft('builtInHold:ended', { stepKey: state.builtInHold.stepKey, early: true }, as())]);
    }

    case 'count:complete': {
      const no = conductorOnly('declares the firing complete') ?? mustBeLive();
      if (no) return no;
      if (state.t0At === null) return refuse(409, 'The count has not reached T-0: scrub it instead if the firing will not happen.');
      return accept([draft('count:completed', {}, as())]);
    }

    case 'count:close-safing': {
      if (!isConductor && !isSafety) return refuse(403, 'Only the test conductor or the safety officer closes safing.');
      if (state.status !== 'safing') return refuse(409, 'The count is not in safing.');
      const open = safingSteps(plan).filter((s) => state.steps[s.key]?.status !== 'done');
      if (open.length > 0) {
        return refuse(409, `Safing is not finished: ${open.length} step${open.length === 1 ? '' : 's'} still open (${open.map((s) => `${s.station}: ${stepLabel(s)}`).join('; ')}).`);
      }
      return accept([draft('count:safed', {}, as())]);
    }
  }
}
