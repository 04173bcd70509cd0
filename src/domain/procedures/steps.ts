/**
 * Procedure steps: their kinds and the rules a revision must pass before it can be saved. The rules return
 * every problem with a path ('phases.2.steps.4.min') so the editor and the API can show each at its field.
 */
import type { PropellantId } from '../propellants/library';
import { formatTMinus, MAX_COUNT_SECONDS } from './tminus';

export const STEP_KINDS = ['action', 'verification', 'reading', 'poll', 'builtInHold', 'personnelCheck'] as const;
export type StepKind = (typeof STEP_KINDS)[number];

export const STEP_KIND_LABELS: Readonly<Record<StepKind, string>> = {
  action: 'Action',
  verification: 'Verification',
  reading: 'Reading with limits',
  poll: 'Go/no-go poll',
  builtInHold: 'Built-in hold',
  personnelCheck: 'Personnel check',
};

export const PERSONNEL_CHECKS = ['keep-out-clear', 'head-count'] as const;
export type PersonnelCheck = (typeof PERSONNEL_CHECKS)[number];

export const PERSONNEL_CHECK_LABELS: Readonly<Record<PersonnelCheck, string>> = {
  'keep-out-clear': 'Keep-out area clear',
  'head-count': 'Head count matches the crew plan',
};

/** The longest planned hold: four hours. */
export const MAX_HOLD_SECONDS = 4 * 3600;

export interface StepBase {
  /** Stable across revisions, so a diff can follow a step that moved or changed. */
  key: string;
  /** Signed seconds from T-0, or null for an untimed step that follows the one before it. */
  tSeconds: number | null;
  /** Short code of the responsible station. */
  station: string;
  instruction: string;
  hazardIds: number[];
  propellants: PropellantId[];
  /** The author's own note, printed with the step's cautions. */
  note: string;
}

export type ActionStep = StepBase & { kind: 'action' };
export type VerificationStep = StepBase & { kind: 'verification' };
/** A measured value and its redline: at least one limit; a reading outside [min, max] is a no-go. */
export type ReadingStep = StepBase & { kind: 'reading'; unit: string; min: number | null; max: number | null };
export type PollStep = StepBase & { kind: 'poll'; stations: string[] };
export type BuiltInHoldStep = StepBase & { kind: 'builtInHold'; durationSeconds: number };
export type PersonnelCheckStep = StepBase & { kind: 'personnelCheck'; checks: PersonnelCheck[]; zone: string };

export type Step = ActionStep | VerificationStep | ReadingStep | PollStep | BuiltInHoldStep | PersonnelCheckStep;

export interface Phase {
  key: string;
  name: string;
  steps: Step[];
}

export interface Problem {
  path: string;
  message: string;
}

export function isStepKind(value: unknown): value is StepKind {
  return typeof value === 'string' && (STEP_KINDS as readonly string[]).includes(value);
}

/** The rules one step must pass on its own; paths are relative to the step. */
export function stepProblems(step: Step): Problem[] {
  const out: Problem[] = [];
  if (step.tSeconds !== null && (!Number.isInteger(step.tSeconds) || Math.abs(step.tSeconds) > MAX_COUNT_SECONDS)) {
    out.push({ path: 'tSeconds', message: 'A count time is whole seconds, within seven days of T-0.' });
  }
  if (step.instruction.trim() === '') out.push({ path: 'instruction', message: 'Write the instruction.' });
  if (step.station.trim() === '') out.push({ path: 'station', message: 'Choose the responsible station.' });
  switch (step.kind) {
    case 'reading': {
      if (step.unit.trim() === '') out.push({ path: 'unit', message: 'A reading needs its unit (bar, %, ohm...).' });
      if (step.min === null && step.max === null) {
        out.push({ path: 'min', message: 'A reading needs at least one limit: a minimum, a maximum or both.' });
      }
      if (step.min !== null && step.max !== null && step.min > step.max) {
        out.push({ path: 'max', message: `The maximum (${step.max}) is below the minimum (${step.min}).` });
      }
      break;
    }
    case 'poll': {
      if (step.stations.length === 0) out.push({ path: 'stations', message: 'A go/no-go poll names the stations that must answer.' });
      const seen = new Set<string>();
      step.stations.forEach((s, i) => {
        if (seen.has(s)) out.push({ path: `stations.${i}`, message: `${s} is listed twice.` });
        seen.add(s);
      });
      break;
    }
    case 'builtInHold': {
      if (!Number.isInteger(step.durationSeconds) || step.durationSeconds < 1 || step.durationSeconds > MAX_HOLD_SECONDS) {
        out.push({ path: 'durationSeconds', message: 'A built-in hold needs its length: whole seconds, at most four hours.' });
      }
      if (step.tSeconds === null) out.push({ path: 'tSeconds', message: 'A built-in hold happens at a count time: give it one.' });
      break;
    }
    case 'personnelCheck': {
      if (step.checks.length === 0) out.push({ path: 'checks', message: 'Say what is checked: keep-out area clear, head count, or both.' });
      break;
    }
    case 'action':
    case 'verification':
      break;
  }
  return out;
}

/** What the sequence rules read of a step; null stands for a step too malformed to read. */
export interface SequenceStep {
  /** Missing on a new step the server has not keyed yet. */
  key?: string;
  tSeconds: number | null;
}

/**
 * Rules across the whole list: times never go back down the list (untimed steps are fine anywhere and follow
 * the step before them), and every step and phase key is used once.
 */
export function sequenceProblems(phases: readonly { key?: string; name?: string; steps: readonly (SequenceStep | null)[] }[]): Problem[] {
  const out: Problem[] = [];
  let last: { t: number; where: string } | null = null;
  const stepKeys = new Map<string, string>();
  const phaseKeys = new Set<string>();
  phases.forEach((phase, p) => {
    if (phase.key !== undefined) {
      if (phaseKeys.has(phase.key)) out.push({ path: `phases.${p}.key`, message: `The phase key '${phase.key}' is used twice.` });
      phaseKeys.add(phase.key);
    }
    phase.steps.forEach((step, s) => {
      if (step === null) return;
      const path = `phases.${p}.steps.${s}`;
      const where = `step ${s + 1} of ${phase.name?.trim() || `phase ${p + 1}`}`;
      if (step.key !== undefined) {
        const earlier = stepKeys.get(step.key);
        if (earlier !== undefined) out.push({ path: `${path}.key`, message: `The step key '${step.key}' is already used by ${earlier}.` });
        else stepKeys.set(step.key, where);
      }
      if (step.tSeconds === null || !Number.isInteger(step.tSeconds)) return;
      if (last !== null && step.tSeconds < last.t) {
        out.push({
          path: `${path}.tSeconds`,
          message: `${formatTMinus(step.tSeconds)} is earlier than ${formatTMinus(last.t)} at ${last.where}: times never go back down the list.`,
        });
        return;
      }
      last = { t: step.tSeconds, where };
    });
  });
  return out;
}

/** What the team has: its station codes and, when known, its hazard ids. */
export interface References {
  stations: ReadonlySet<string>;
  hazardIds?: ReadonlySet<number>;
}

/** Steps may only name stations (and hazards) the team has; null stands for an unreadable step. */
export function referenceProblems(phases: readonly { steps: readonly (Step | null)[] }[], refs: References): Problem[] {
  const out: Problem[] = [];
  phases.forEach((phase, p) =>
    phase.steps.forEach((step, s) => {
      if (step === null) return;
      const path = `phases.${p}.steps.${s}`;
      if (step.station.trim() !== '' && !refs.stations.has(step.station)) {
        out.push({ path: `${path}.station`, message: `There is no station with the short code ${step.station}.` });
      }
      if (step.kind === 'poll') {
        step.stations.forEach((code, i) => {
          if (!refs.stations.has(code)) out.push({ path: `${path}.stations.${i}`, message: `There is no station with the short code ${code}.` });
        });
      }
      if (refs.hazardIds) {
        step.hazardIds.forEach((id, i) => {
          if (!refs.hazardIds!.has(id)) out.push({ path: `${path}.hazardIds.${i}`, message: `There is no hazard with id ${id} in your register.` });
        });
      }
    }),
  );
  return out;
}

/** Every problem of a revision's content: each step's own rules, the sequence, and (when given) references. */
export function validatePhases(phases: readonly Phase[], refs?: References): Problem[] {
  const own = phases.flatMap((phase, p) =>
    [
      ...(phase.name.trim() === '' ? [{ path: `phases.${p}.name`, message: 'Name the phase.' }] : []),
      ...phase.steps.flatMap((step, s) => stepProblems(step).map((pr) => ({ ...pr, path: `phases.${p}.steps.${s}.${pr.path}` }))),
    ],
  );
  return [...own, ...sequenceProblems(phases), ...(refs ? referenceProblems(phases, refs) : [])];
}

export function stepCount(phases: readonly { steps: readonly unknown[] }[]): number {
  return phases.reduce((n, p) => n + p.steps.length, 0);
}

/**
 * The step with its fields in one order and its lists without repeats, so two saves of the same content
 * compare equal and a diff shows only real changes.
 */
export function normaliseStep(step: Step): Step {
  const base = {
    key: step.key,
    kind: step.kind,
    tSeconds: step.tSeconds,
    station: step.station,
    instruction: step.instruction,
    hazardIds: [...new Set(step.hazardIds)],
    propellants: [...new Set(step.propellants)],
    note: step.note,
  };
  switch (step.kind) {
    case 'reading':
      return { ...base, kind: 'reading', unit: step.unit, min: step.min, max: step.max };
    case 'poll':
      return { ...base, kind: 'poll', stations: [...step.stations] };
    case 'builtInHold':
      return { ...base, kind: 'builtInHold', durationSeconds: step.durationSeconds };
    case 'personnelCheck':
      return { ...base, kind: 'personnelCheck', checks: [...new Set(step.checks)], zone: step.zone };
    case 'action':
      return { ...base, kind: 'action' };
    case 'verification':
      return { ...base, kind: 'verification' };
  }
}
