/**
 * The plan a count runs: a revision's phases flattened into one ordered list of steps, with the count time
 * each step is reached at. Safing phases are set apart: they are not counted, they run after a scrub or after
 * firing.
 */
import type { ResolvedCaution } from '../procedures/cautions';
import type { Phase, Step } from '../procedures/steps';
import type { CountPlan, PlanCaution, PlanStep } from './events';

export const DEFAULT_POLL_TIMEOUT_SECONDS = 60;
/** Terminal count from T-1:00 and a recycle to T-10:00 (common practice, no source). */
export const DEFAULT_TERMINAL_COUNT_SECONDS = -60;
export const DEFAULT_RECYCLE_TO_SECONDS = -600;

export type PhaseWithCautions = Omit<Phase, 'steps'> & { steps: (Step & { cautions?: readonly ResolvedCaution[]; ppe?: readonly string[] })[] };

function cautionSource(c: ResolvedCaution): string {
  return c.sources
    .map((s) => (s.type === 'hazard' ? s.hazardCode : s.type === 'propellant' ? `propellant ${s.propellantId}` : 'step note'))
    .join(', ');
}

export function planCautions(cautions: readonly ResolvedCaution[]): PlanCaution[] {
  return cautions.map((c) => ({ kind: c.level, text: c.text, source: cautionSource(c) }));
}

export function buildPlanSteps(phases: readonly PhaseWithCautions[]): PlanStep[] {
  const out: PlanStep[] = [];
  for (const phase of phases) {
    for (const step of phase.steps) {
      out.push({
        key: step.key,
        phaseKey: phase.key,
        phaseName: phase.name,
        index: out.length,
        tSeconds: step.tSeconds,
        station: step.station,
        kind: step.kind,
        instruction: step.instruction,
        unit: step.kind === 'reading' ? step.unit : null,
        min: step.kind === 'reading' ? step.min : null,
        max: step.kind === 'reading' ? step.max : null,
        stations: step.kind === 'poll' ? [...step.stations] : [],
        durationSeconds: step.kind === 'builtInHold' ? step.durationSeconds : null,
        cautions: planCautions(step.cautions ?? []),
        ppe: [...(step.ppe ?? [])],
      });
    }
  }
  return out;
}

/** Phases named for safing or making safe; the server offers these when the person creating a count names none. */
export function guessSafingPhaseKeys(phases: readonly { key: string; name: string }[]): string[] {
  return phases.filter((p) => /\bsaf(ing|e)\b/i.test(p.name)).map((p) => p.key);
}

export function isSafingStep(plan: Pick<CountPlan, 'safingPhaseKeys'>, step: PlanStep): boolean {
  return plan.safingPhaseKeys.includes(step.phaseKey);
}

/**
 * Worked out once per plan object: a count's plan never changes after count:created, and the clock asks for these
 * on every event. Callers only read what they get.
 */
function oncePerPlan<T>(make: (plan: CountPlan) => T): (plan: CountPlan) => T {
  const made = new WeakMap<CountPlan, T>();
  return (plan) => {
    if (made.has(plan)) return made.get(plan)!;
    const value = make(plan);
    made.set(plan, value);
    return value;
  };
}

/** The steps the clock runs through, in plan order. */
export const countedSteps: (plan: CountPlan) => readonly PlanStep[] = oncePerPlan((plan) => plan.steps.filter((s) => !isSafingStep(plan, s)));

export const safingSteps: (plan: CountPlan) => readonly PlanStep[] = oncePerPlan((plan) => plan.steps.filter((s) => isSafingStep(plan, s)));

/** Where a count starts by default: the first counted step's time, or T-10:00 for a plan without times. */
export function defaultStartT(steps: readonly PlanStep[], safingPhaseKeys: readonly string[] = []): number {
  const first = steps.find((s) => s.tSeconds !== null && !safingPhaseKeys.includes(s.phaseKey));
  return first?.tSeconds ?? DEFAULT_RECYCLE_TO_SECONDS;
}

/**
 * The count time each counted step is reached at: its own time, or for an untimed step the time of the step
 * before it; a step before the start (or untimed before any timed one) is reached at the start.
 */
export const reachTimes: (plan: CountPlan) => ReadonlyMap<string, number> = oncePerPlan((plan) => {
  const out = new Map<string, number>();
  let last = plan.startTSeconds;
  for (const step of countedSteps(plan)) {
    if (step.tSeconds !== null) last = Math.max(step.tSeconds, plan.startTSeconds);
    out.set(step.key, last);
  }
  return out;
});

/** A short label for messages: the instruction, cut at 80 characters. */
export function stepLabel(step: Pick<PlanStep, 'instruction' | 'key'>): string {
  const text = step.instruction.trim() || step.key;
  return text.length > 80 ? `${text.slice(0, 79)}…` : text;
}
