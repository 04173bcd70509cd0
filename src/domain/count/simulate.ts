/**
 * A count run in virtual time, the way the server runs one: before each command, and whenever time passes, the
 * events the clock made due are appended; then `decide` answers the command. Used to write the demo counts (and by
 * the domain tests). `crewUntil` lets a disciplined crew work the count: each station does its current steps and
 * answers each poll go a little while after it came up, so a script only has to say what went wrong.
 */
import type { Role } from '../people/roles';
import { decide, type CountCommand, type Decision } from './commands';
import { dueEvents, nextDueAt } from './due';
import { draft, stampEvents, type Actor, type CountEvent, type CountPlan, type EventDraft, type PlanStep } from './events';
import { reduce } from './reduce';
import { initialCountState, tAt, type CountState } from './state';

export interface SimPerson {
  userId: number;
  name: string;
  roles: Role[];
  /** Station codes this person mans in the count. */
  mans: string[];
}

export interface CrewOptions {
  /** Seconds after a step became current that its station does it; default 15 to 45 s, by the step's place. */
  stepDelaySeconds?: (step: PlanStep) => number;
  /** Seconds after a poll opened that a station answers; default 4 to 28 s, by the station's place and the poll's. */
  answerDelaySeconds?: (station: string, index: number, pollNumber: number) => number;
  /** The value read for a reading step; default the middle of its limits. */
  readingFor?: (step: PlanStep) => number;
  /** Steps nobody does (yet): their keys. */
  skip?: readonly string[];
}

/** The middle of a reading's limits, or well inside the one limit it has. */
export function inLimitsValue(step: Pick<PlanStep, 'min' | 'max'>): number {
  if (step.min !== null && step.max !== null) return Math.round(((step.min + step.max) / 2) * 100) / 100;
  if (step.max !== null) return Math.round(step.max * 0.4 * 100) / 100;
  if (step.min !== null) return Math.round((step.min * 1.1 + 0.5) * 100) / 100;
  return 0;
}

const defaultStepDelay = (step: PlanStep) => 15 + ((step.index * 7) % 31);
const defaultAnswerDelay = (_station: string, index: number, pollNumber: number) => 4 + ((index * 5 + pollNumber * 7) % 25);

export class CountSimulation {
  events: CountEvent[] = [];
  state: CountState = initialCountState();

  constructor(plan: CountPlan, creator: Actor, createdAt: number) {
    this.append([{ type: 'count:created', payload: plan, actor: creator, station: null }], createdAt);
  }

  /** The simulation's clock: the latest instant it was taken to (events or not). */
  now = 0;

  append(drafts: readonly EventDraft[], now: number): CountEvent[] {
    this.now = Math.max(this.now, now);
    const stamped = stampEvents(this.state.lastSeq, drafts, now);
    for (const e of stamped) {
      this.events.push(e);
      this.state = reduce(this.state, e);
    }
    return stamped;
  }

  /** Let time pass to `now`: append what the clock made due. */
  advance(now: number): CountEvent[] {
    this.now = Math.max(this.now, now);
    return this.append(dueEvents(this.state, now), now);
  }

  /** As the server does: catch up to `now`, decide, append what was decided. */
  command(who: SimPerson, command: CountCommand, now: number): Decision {
    this.advance(now);
    const d = decide(this.state, command, { now, actor: { userId: who.userId, name: who.name, roles: who.roles }, mannedStations: who.mans });
    if (d.ok) this.append(d.events, now);
    return d;
  }

  /** A command that must be accepted. */
  ok(who: SimPerson, command: CountCommand, now: number): CountEvent[] {
    const before = this.events.length;
    const d = this.command(who, command, now);
    if (!d.ok) throw new Error(`refused ${command.type}: ${d.error}`);
    return this.events.slice(before);
  }

  /** Stations coming on line, as a phone joining the count logs it. */
  connect(people: readonly SimPerson[], now: number): CountEvent[] {
    this.advance(now);
    const drafts = people.flatMap((p) =>
      p.mans.filter((s) => this.state.stations[s]).map((station) => draft('station:connected', { station }, { actor: { userId: p.userId, name: p.name }, station })),
    );
    return this.append(drafts, now);
  }

  /** The crew works the count until the clock reads `tSeconds` (or the count ends). */
  crewToT(tSeconds: number, crew: readonly SimPerson[], options: CrewOptions = {}): void {
    for (let guard = 0; guard < 100_000; guard++) {
      if (this.state.status === 'scrubbed' || this.state.status === 'complete') return;
      if (tAt(this.state, this.now) >= tSeconds) return;
      // Where the clock would be at tSeconds if nothing stopped it; built-in holds and holds stop it on the way.
      const ahead = this.state.clock.running ? Math.max(1000, (tSeconds - tAt(this.state, this.now)) * 1000) : 5000;
      this.crewUntil(this.now + Math.min(ahead, 60_000), crew, options);
    }
    throw new Error(`the clock never reached ${tSeconds}`);
  }

  /**
   * The crew works the count until `until` (epoch ms) or until `stop(state)` holds after an event: every current
   * step is done by someone manning its station, every open poll answered go. Holds, recycles and scrubs are the
   * script's to call; the crew goes on with what is current while holding.
   */
  crewUntil(until: number, crew: readonly SimPerson[], options: CrewOptions = {}, stop?: (state: CountState) => boolean): void {
    const stepDelay = options.stepDelaySeconds ?? defaultStepDelay;
    const answerDelay = options.answerDelaySeconds ?? defaultAnswerDelay;
    const readingFor = options.readingFor ?? inLimitsValue;
    const skip = new Set(options.skip ?? []);
    const personFor = (station: string) => crew.find((p) => p.mans.includes(station));

    for (let guard = 0; guard < 100_000; guard++) {
      if (stop?.(this.state)) return;
      const plan = this.state.plan;
      if (!plan || this.state.status === 'scrubbed' || this.state.status === 'complete') return;

      // What the crew would do next, and when.
      let next: { at: number; who: SimPerson; command: CountCommand } | null = null;
      const consider = (at: number, who: SimPerson | undefined, command: CountCommand) => {
        if (who && (next === null || at < next.at)) next = { at, who, command };
      };
      for (const step of plan.steps) {
        const st = this.state.steps[step.key];
        if (st?.status !== 'current' || st.reachedAt === null || skip.has(step.key)) continue;
        if (step.kind === 'poll' || step.kind === 'builtInHold') continue;
        const at = st.reachedAt + stepDelay(step) * 1000;
        if (step.kind === 'reading') consider(at, personFor(step.station), { type: 'reading:record', stepKey: step.key, value: readingFor(step) });
        else consider(at, personFor(step.station), { type: 'step:complete', stepKey: step.key });
      }
      const poll = this.state.poll;
      if (poll) {
        poll.stations.forEach((station, i) => {
          if (poll.answers[station]) return;
          consider(poll.openedAt + answerDelay(station, i, this.state.polls.length + 1) * 1000, personFor(station), { type: 'poll:answer', pollId: poll.pollId, station, answer: 'go' });
        });
      }

      const due = nextDueAt(this.state);
      const action = next as { at: number; who: SimPerson; command: CountCommand } | null;
      const when = Math.min(action?.at ?? Infinity, due ?? Infinity);
      if (when > until) {
        this.advance(until);
        return;
      }
      if (action && action.at <= (due ?? Infinity)) {
        const d = this.command(action.who, action.command, Math.max(action.at, this.now));
        if (!d.ok) throw new Error(`the crew could not ${action.command.type}: ${d.error}`);
      } else {
        this.advance(Math.max(due!, this.now));
      }
    }
    throw new Error('the crew went round too many times');
  }
}
