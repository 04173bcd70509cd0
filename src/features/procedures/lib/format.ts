/** Words for procedure data: count times, step facts, diff fields and problem paths. */
import type { CautionSource } from '../../../domain/procedures/cautions';
import type { Role } from '../../../domain/people/roles';
import { hasAnyRole } from '../../../domain/people/roles';
import { PERSONNEL_CHECK_LABELS, STEP_KIND_LABELS, type PersonnelCheck, type Step, type StepKind } from '../../../domain/procedures/steps';
import { formatDuration, formatTMinus } from '../../../domain/procedures/tminus';
import { PROPELLANTS, type PropellantId } from '../../../domain/propellants/library';
import type { SignoffRole } from '../../../domain/procedures/release';

export const UNTIMED = 'untimed';

/** 'T-30:00', 'T+5:00', or 'untimed'. */
export function tLabel(tSeconds: number | null): string {
  return tSeconds === null ? UNTIMED : formatTMinus(tSeconds);
}

/** 'T minus 30 minutes' for screen readers would be nicer, but the printed form is what the crew says. */
export function tSpoken(tSeconds: number | null): string {
  return tSeconds === null ? 'untimed, follows the step before' : formatTMinus(tSeconds).replace('T-', 'T minus ').replace('T+', 'T plus ');
}

export function kindLabel(kind: StepKind): string {
  return STEP_KIND_LABELS[kind];
}

export function propellantName(id: string): string {
  return (PROPELLANTS as Record<string, { name: string } | undefined>)[id]?.name ?? id;
}

export const PROPELLANT_OPTIONS = (Object.keys(PROPELLANTS) as PropellantId[]).map((id) => ({ value: id, label: PROPELLANTS[id].name }));

export const SIGNOFF_LABELS: Readonly<Record<SignoffRole, string>> = {
  conductor: 'Test conductor',
  safety: 'Safety officer',
};

const num = (n: number) => String(n);

/** A reading's redline in words: 'between 2 and 4.5 bar', 'at most 10 m/s', 'at least 85 %'. */
export function limitsText(unit: string, min: number | null, max: number | null): string {
  const u = unit ? ` ${unit}` : '';
  if (min !== null && max !== null) return `between ${num(min)} and ${num(max)}${u}`;
  if (max !== null) return `at most ${num(max)}${u}`;
  if (min !== null) return `at least ${num(min)}${u}`;
  return 'no limit set';
}

export function checksText(checks: readonly PersonnelCheck[]): string {
  return checks.map((c) => PERSONNEL_CHECK_LABELS[c]).join('; ');
}

/** The kind-specific facts of a step, one short line each. */
export function stepFacts(step: Step): { label: string; value: string }[] {
  switch (step.kind) {
    case 'reading':
      return [{ label: 'Go when', value: limitsText(step.unit, step.min, step.max) }];
    case 'poll':
      return [{ label: 'Stations answering', value: step.stations.join(', ') }];
    case 'builtInHold':
      return [{ label: 'Hold length', value: `${formatDuration(step.durationSeconds)} (${holdWords(step.durationSeconds)})` }];
    case 'personnelCheck':
      return [
        { label: 'Check', value: checksText(step.checks) },
        ...(step.zone ? [{ label: 'Zone', value: step.zone }] : []),
      ];
    case 'action':
    case 'verification':
      return [];
  }
}

function holdWords(seconds: number): string {
  const m = Math.floor(seconds / 60);
  const s = seconds % 60;
  const parts = [];
  if (m) parts.push(`${m} minute${m === 1 ? '' : 's'}`);
  if (s) parts.push(`${s} second${s === 1 ? '' : 's'}`);
  return parts.join(' ') || '0 seconds';
}

const VERIFICATION_WORDS: Record<string, string> = {
  planned: 'verification planned',
  'in-progress': 'verification in progress',
  verified: 'verified',
  failed: 'verification failed',
};

/** Where a caution comes from, in words: 'HZ-003, crew mitigation', 'Liquid oxygen handling'. */
export function sourceText(source: CautionSource): string {
  switch (source.type) {
    case 'hazard': {
      const crew = source.mitigationKind === 'procedure-ppe' || source.mitigationKind === 'warning-device';
      const v = VERIFICATION_WORDS[source.verificationStatus] ?? source.verificationStatus;
      return crew ? `${source.hazardCode} mitigation` : `${source.hazardCode} hardware protection, ${v}`;
    }
    case 'propellant':
      return source.cautionKey === null ? `${propellantName(source.propellantId)} PPE` : `${propellantName(source.propellantId)} handling`;
    case 'step':
      return 'author’s note';
  }
}

// ---------------------------------------------------------------- diff

export const FIELD_LABELS: Readonly<Record<string, string>> = {
  tSeconds: 'Time',
  station: 'Station',
  instruction: 'Instruction',
  kind: 'Kind',
  hazardIds: 'Linked hazards',
  propellants: 'Propellants',
  note: 'Note',
  unit: 'Unit',
  min: 'Minimum',
  max: 'Maximum',
  stations: 'Stations answering',
  durationSeconds: 'Hold length',
  checks: 'Checks',
  zone: 'Zone',
};

export function fieldLabel(field: string): string {
  return FIELD_LABELS[field] ?? field;
}

/** A step field's value in words, for the diff's before/after. */
export function fieldValueText(field: string, value: unknown, hazardCode: (id: number) => string): string {
  if (value === undefined) return '(not set)';
  switch (field) {
    case 'tSeconds':
      return tLabel(value as number | null);
    case 'kind':
      return STEP_KIND_LABELS[value as StepKind] ?? String(value);
    case 'hazardIds': {
      const ids = value as number[];
      return ids.length ? ids.map(hazardCode).join(', ') : 'none';
    }
    case 'propellants': {
      const ids = value as string[];
      return ids.length ? ids.map(propellantName).join(', ') : 'none';
    }
    case 'stations': {
      const codes = value as string[];
      return codes.length ? codes.join(', ') : 'none';
    }
    case 'checks': {
      const checks = value as PersonnelCheck[];
      return checks.length ? checksText(checks) : 'none';
    }
    case 'durationSeconds':
      return typeof value === 'number' && Number.isInteger(value) && value >= 0 ? formatDuration(value) : String(value);
    case 'min':
    case 'max':
      return value === null ? 'no limit' : String(value);
    default:
      return typeof value === 'string' ? (value.trim() === '' ? '(empty)' : value) : JSON.stringify(value);
  }
}

// ---------------------------------------------------------------- problem paths

/**
 * 'phases.2.steps.4.max' -> 'Phase 3 (Loading), step 5, maximum'. `names` gives phase names where known.
 * Paths from an import file use its own field names (t, hazards).
 */
export function pathText(path: string, phaseName?: (index: number) => string | undefined): string {
  const parts = path.split('.');
  const out: string[] = [];
  let i = 0;
  if (parts[0] === 'phases' && parts[1] !== undefined && /^\d+$/.test(parts[1])) {
    const p = Number(parts[1]);
    const name = phaseName?.(p);
    out.push(`Phase ${p + 1}${name ? ` (${name})` : ''}`);
    i = 2;
    if (parts[2] === 'steps' && parts[3] !== undefined && /^\d+$/.test(parts[3])) {
      out.push(`step ${Number(parts[3]) + 1}`);
      i = 4;
    }
  }
  const rest = parts.slice(i);
  if (rest.length) {
    const [field, ...more] = rest;
    const fileNames: Record<string, string> = { t: 'time', hazards: 'hazards', format: 'format', version: 'version', procedure: 'procedure' };
    let word = fieldLabel(field!);
    if (word === field) word = fileNames[field!] ?? field!;
    else word = word.toLowerCase();
    const idx = more.find((m) => /^\d+$/.test(m));
    const tail = more.filter((m) => !/^\d+$/.test(m));
    out.push([word, idx !== undefined ? `entry ${Number(idx) + 1}` : '', ...tail].filter(Boolean).join(' '));
  }
  const text = out.join(', ');
  return text ? text.charAt(0).toUpperCase() + text.slice(1) : 'The file';
}

// ---------------------------------------------------------------- who may do what

/** Conductors, safety officers and admins write procedures; everyone else reads them. */
export function canWriteProcedures(roles: readonly Role[]): boolean {
  return hasAnyRole(roles, ['conductor', 'safety', 'admin']);
}

/** Stations and crew plans are the conductor's and the admin's. */
export function canEditStations(roles: readonly Role[]): boolean {
  return hasAnyRole(roles, ['conductor', 'admin']);
}

export function canSignAs(roles: readonly Role[], as: SignoffRole): boolean {
  return roles.includes(as);
}

/** Read a route parameter that must be a positive id. */
export function idParam(value: string | undefined): number | null {
  return value && /^[1-9]\d{0,8}$/.test(value) ? Number(value) : null;
}

/** The caution shown wherever a revision is signed, released or printed. */
export const RELEASE_CAUTION =
  'Holdfire is a planning and record aid, not a safety authority. Releasing a revision here records that a test conductor and a ' +
  'safety officer signed it; it does not replace your site’s own approvals, permits, local codes or licensed practice.';
