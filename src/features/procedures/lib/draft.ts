/**
 * The draft editor's model: the revision's phases and steps as the form holds them (text for times,
 * limits and hold lengths, so a half-typed value is kept and reported, not lost), and the moves the
 * editor makes. Pure functions, so the reordering rules are tested without a browser.
 */
import type { PhaseInput, StepInput } from '../../../contract/procedures';
import type { PersonnelCheck, Phase, Step, StepKind } from '../../../domain/procedures/steps';
import { formatDuration, formatTMinus, parseTMinus } from '../../../domain/procedures/tminus';
import type { PropellantId } from '../../../domain/propellants/library';

export interface StepDraft {
  key: string;
  kind: StepKind;
  /** 'T-30:00', or '' for an untimed step. */
  time: string;
  station: string;
  instruction: string;
  hazardIds: number[];
  propellants: PropellantId[];
  note: string;
  // Every kind's own fields are kept, so switching the kind back and forth loses nothing.
  unit: string;
  min: string;
  max: string;
  stations: string[];
  /** A hold's length as 'm:ss' or 'h:mm:ss'. */
  duration: string;
  checks: PersonnelCheck[];
  zone: string;
}

export interface PhaseDraft {
  key: string;
  name: string;
  steps: StepDraft[];
}

/** Keys like the server's: random, so two editors never hand out the same one. */
export function newKey(prefix: 's' | 'p'): string {
  const bytes = new Uint8Array(6);
  crypto.getRandomValues(bytes);
  const b64 = btoa(String.fromCharCode(...bytes)).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
  return `${prefix}-${b64}`;
}

export function stepToDraft(step: Step): StepDraft {
  return {
    key: step.key,
    kind: step.kind,
    time: step.tSeconds === null ? '' : formatTMinus(step.tSeconds),
    station: step.station,
    instruction: step.instruction,
    hazardIds: [...step.hazardIds],
    propellants: [...step.propellants],
    note: step.note,
    unit: step.kind === 'reading' ? step.unit : '',
    min: step.kind === 'reading' && step.min !== null ? String(step.min) : '',
    max: step.kind === 'reading' && step.max !== null ? String(step.max) : '',
    stations: step.kind === 'poll' ? [...step.stations] : [],
    duration: step.kind === 'builtInHold' ? formatDuration(step.durationSeconds) : '',
    checks: step.kind === 'personnelCheck' ? [...step.checks] : [],
    zone: step.kind === 'personnelCheck' ? step.zone : '',
  };
}

export function phasesToDraft(phases: readonly Phase[]): PhaseDraft[] {
  return phases.map((p) => ({ key: p.key, name: p.name, steps: p.steps.map(stepToDraft) }));
}

export function blankStep(station: string): StepDraft {
  return {
    key: newKey('s'),
    kind: 'action',
    time: '',
    station,
    instruction: '',
    hazardIds: [],
    propellants: [],
    note: '',
    unit: '',
    min: '',
    max: '',
    stations: [],
    duration: '',
    checks: [],
    zone: '',
  };
}

export function blankPhase(name = ''): PhaseDraft {
  return { key: newKey('p'), name, steps: [] };
}

// ---------------------------------------------------------------- reading the text fields

/** '10:00' -> 600, '1:00:00' -> 3600, '10' -> 600 (whole minutes); undefined when unreadable. */
export function parseDuration(text: string): number | undefined {
  const t = text.trim();
  if (/^\d{1,3}$/.test(t)) return Number(t) * 60;
  let m = /^(\d{1,3}):([0-5]\d)$/.exec(t);
  if (m) return Number(m[1]) * 60 + Number(m[2]);
  m = /^(\d{1,2}):([0-5]\d):([0-5]\d)$/.exec(t);
  if (m) return Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3]);
  return undefined;
}

/** '' -> null; '2.5' or '2,5' -> 2.5; undefined when not a number. */
export function parseLimit(text: string): number | null | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return null;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(t)) return undefined;
  return Number(t);
}

export const DURATION_HINT = 'Minutes and seconds, like 10:00, or hours like 1:00:00.';

/** What is wrong with the text fields themselves, at the paths the API uses. */
export interface TextProblem {
  field: 'tSeconds' | 'min' | 'max' | 'durationSeconds';
  message: string;
}

/**
 * The step as the API takes it, plus any text field that could not be read. An unreadable field is sent
 * as a neutral value (untimed, no limit, zero length) so the other rules still run; its own message wins.
 */
export function draftToInput(d: StepDraft): { input: StepInput; problems: TextProblem[] } {
  const problems: TextProblem[] = [];
  let tSeconds: number | null = null;
  if (d.time.trim() !== '') {
    const t = parseTMinus(d.time);
    if (t === undefined) problems.push({ field: 'tSeconds', message: 'Write a count time like T-30:00, T+5:00 or T-2:00:00, or leave it empty for an untimed step.' });
    else tSeconds = t;
  }
  const base = {
    key: d.key,
    tSeconds,
    station: d.station,
    instruction: d.instruction,
    hazardIds: [...d.hazardIds],
    propellants: [...d.propellants],
    note: d.note,
  };
  switch (d.kind) {
    case 'reading': {
      const limit = (field: 'min' | 'max') => {
        const v = parseLimit(d[field]);
        if (v === undefined) {
          problems.push({ field, message: 'Write a number, like 2.5, or leave it empty.' });
          return null;
        }
        return v;
      };
      return { input: { ...base, kind: 'reading', unit: d.unit, min: limit('min'), max: limit('max') }, problems };
    }
    case 'poll':
      return { input: { ...base, kind: 'poll', stations: [...d.stations] }, problems };
    case 'builtInHold': {
      let durationSeconds = 0;
      if (d.duration.trim() !== '') {
        const v = parseDuration(d.duration);
        if (v === undefined) problems.push({ field: 'durationSeconds', message: `Not a length of time. ${DURATION_HINT}` });
        else durationSeconds = v;
      }
      return { input: { ...base, kind: 'builtInHold', durationSeconds }, problems };
    }
    case 'personnelCheck':
      return { input: { ...base, kind: 'personnelCheck', checks: [...d.checks], zone: d.zone }, problems };
    case 'action':
      return { input: { ...base, kind: 'action' }, problems };
    case 'verification':
      return { input: { ...base, kind: 'verification' }, problems };
  }
}

export function draftToContent(phases: readonly PhaseDraft[]): { phases: PhaseInput[]; textProblems: { path: string; message: string }[] } {
  const textProblems: { path: string; message: string }[] = [];
  const out = phases.map((p, pi) => ({
    key: p.key,
    name: p.name,
    steps: p.steps.map((s, si) => {
      const { input, problems } = draftToInput(s);
      for (const pr of problems) textProblems.push({ path: `phases.${pi}.steps.${si}.${pr.field}`, message: pr.message });
      return input;
    }),
  }));
  return { phases: out, textProblems };
}

// ---------------------------------------------------------------- moves

export interface StepPlace {
  phase: number;
  index: number;
}

export function findStep(phases: readonly PhaseDraft[], key: string): StepPlace | null {
  for (let p = 0; p < phases.length; p++) {
    const index = phases[p]!.steps.findIndex((s) => s.key === key);
    if (index >= 0) return { phase: p, index };
  }
  return null;
}

/** Moves a step to `to` (index counted in the target phase after the step has left its old place). */
export function moveStepTo(phases: readonly PhaseDraft[], key: string, to: StepPlace): PhaseDraft[] {
  const from = findStep(phases, key);
  if (!from || to.phase < 0 || to.phase >= phases.length) return phases as PhaseDraft[];
  const next = phases.map((p) => ({ ...p, steps: [...p.steps] }));
  const [step] = next[from.phase]!.steps.splice(from.index, 1);
  const target = next[to.phase]!.steps;
  target.splice(Math.max(0, Math.min(to.index, target.length)), 0, step!);
  return next;
}

/**
 * One place up or down the whole list: past the first step of a phase it goes to the end of the phase
 * before; past the last, to the start of the next. Empty phases are passed through as places too, so a
 * step can be moved into one.
 */
export function moveStepBy(phases: readonly PhaseDraft[], key: string, delta: -1 | 1): PhaseDraft[] {
  const from = findStep(phases, key);
  if (!from) return phases as PhaseDraft[];
  const len = phases[from.phase]!.steps.length;
  if (delta === -1) {
    if (from.index > 0) return moveStepTo(phases, key, { phase: from.phase, index: from.index - 1 });
    if (from.phase === 0) return phases as PhaseDraft[];
    return moveStepTo(phases, key, { phase: from.phase - 1, index: phases[from.phase - 1]!.steps.length });
  }
  if (from.index < len - 1) return moveStepTo(phases, key, { phase: from.phase, index: from.index + 1 });
  if (from.phase === phases.length - 1) return phases as PhaseDraft[];
  return moveStepTo(phases, key, { phase: from.phase + 1, index: 0 });
}

export function canMoveStep(phases: readonly PhaseDraft[], key: string, delta: -1 | 1): boolean {
  const from = findStep(phases, key);
  if (!from) return false;
  if (delta === -1) return from.index > 0 || from.phase > 0;
  return from.index < phases[from.phase]!.steps.length - 1 || from.phase < phases.length - 1;
}

export function movePhase(phases: readonly PhaseDraft[], from: number, to: number): PhaseDraft[] {
  if (from === to || from < 0 || to < 0 || from >= phases.length || to >= phases.length) return phases as PhaseDraft[];
  const next = [...phases];
  const [phase] = next.splice(from, 1);
  next.splice(to, 0, phase!);
  return next;
}

export function updateStep(phases: readonly PhaseDraft[], key: string, patch: Partial<Omit<StepDraft, 'key'>>): PhaseDraft[] {
  return phases.map((p) => (p.steps.some((s) => s.key === key) ? { ...p, steps: p.steps.map((s) => (s.key === key ? { ...s, ...patch } : s)) } : p));
}

/** Inserts a new step after `afterKey`, or at the end of phase `phase` when no key is given. */
export function insertStep(phases: readonly PhaseDraft[], phase: number, step: StepDraft, afterKey?: string): PhaseDraft[] {
  return phases.map((p, i) => {
    if (i !== phase) return p;
    const at = afterKey === undefined ? p.steps.length : p.steps.findIndex((s) => s.key === afterKey) + 1;
    const steps = [...p.steps];
    steps.splice(at <= 0 && afterKey !== undefined ? steps.length : at, 0, step);
    return { ...p, steps };
  });
}

export function removeStep(phases: readonly PhaseDraft[], key: string): PhaseDraft[] {
  return phases.map((p) => ({ ...p, steps: p.steps.filter((s) => s.key !== key) }));
}

export function stepTotal(phases: readonly { steps: readonly unknown[] }[]): number {
  return phases.reduce((n, p) => n + p.steps.length, 0);
}

/** Content equality for the unsaved-changes guard. */
export function sameDraft(a: readonly PhaseDraft[], b: readonly PhaseDraft[]): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}
