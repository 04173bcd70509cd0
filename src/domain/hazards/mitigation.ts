/**
 * Mitigations in MIL-STD-882E order of precedence (section 4.3.4), the rule
 * that only design changes can eliminate a hazard, and hazard status flow.
 */
import { LIKELIHOOD_LEVELS, type LikelihoodLevel } from './matrix';

export const MITIGATION_KINDS = [
  'design-selection',
  'design-alteration',
  'engineered-feature',
  'warning-device',
  'procedure-ppe',
] as const;
export type MitigationKind = (typeof MITIGATION_KINDS)[number];

export const MITIGATION_KIND_INFO: Readonly<Record<MitigationKind, { label: string; precedence: number }>> = {
  'design-selection': { label: 'Eliminate the hazard through design selection', precedence: 1 },
  'design-alteration': { label: 'Reduce risk through design alteration', precedence: 2 },
  'engineered-feature': { label: 'Incorporate engineered features or devices', precedence: 3 },
  'warning-device': { label: 'Provide warning devices', precedence: 4 },
  'procedure-ppe': { label: 'Signage, procedures, training and PPE', precedence: 5 },
};

export function isMitigationKind(value: unknown): value is MitigationKind {
  return typeof value === 'string' && (MITIGATION_KINDS as readonly string[]).includes(value);
}

/** Kinds that change only what people know or wear, never the hazard itself. */
const CANNOT_ELIMINATE: ReadonlySet<MitigationKind> = new Set(['warning-device', 'procedure-ppe']);

/** Sort mitigations by precedence, most effective kind first. */
export function byPrecedence<T extends { kind: MitigationKind }>(mitigations: readonly T[]): T[] {
  return [...mitigations].sort((a, b) => MITIGATION_KIND_INFO[a.kind].precedence - MITIGATION_KIND_INFO[b.kind].precedence);
}

export interface ResidualCheckInput {
  initialLikelihood: string;
  residualLikelihood: string;
  mitigations: readonly { kind: MitigationKind }[];
}

export type ResidualProblemCode =
  | 'unknown-likelihood'
  | 'unknown-mitigation-kind'
  | 'residual-worse-than-initial'
  | 'lowered-without-mitigation'
  | 'eliminated-without-design-change';

export type ResidualCheck = { ok: true } | { ok: false; code: ResidualProblemCode; message: string };

// Index in A..F: a larger index is less likely.
function likelihoodIndex(key: string): number {
  return LIKELIHOOD_LEVELS.findIndex((l) => l.key === key);
}

/** Refuses a residual likelihood the listed mitigations cannot justify. */
export function checkResidual(input: ResidualCheckInput): ResidualCheck {
  const initial = likelihoodIndex(input.initialLikelihood);
  const residual = likelihoodIndex(input.residualLikelihood);
  if (initial < 0 || residual < 0) {
    const bad = initial < 0 ? input.initialLikelihood : input.residualLikelihood;
    return { ok: false, code: 'unknown-likelihood', message: `'${bad}' is not a likelihood level (A to F).` };
  }
  const unknown = input.mitigations.find((m) => !isMitigationKind(m.kind));
  if (unknown) return { ok: false, code: 'unknown-mitigation-kind', message: `'${String(unknown.kind)}' is not a mitigation kind.` };
  if (residual < initial) {
    return { ok: false, code: 'residual-worse-than-initial', message: 'Residual likelihood cannot be higher than the initial likelihood.' };
  }
  if (residual === initial) return { ok: true };
  if (input.mitigations.length === 0) {
    return { ok: false, code: 'lowered-without-mitigation', message: 'A lower residual likelihood needs at least one mitigation.' };
  }
  const eliminated: LikelihoodLevel = 'F';
  const onlySoft = input.mitigations.every((m) => CANNOT_ELIMINATE.has(m.kind));
  if (input.residualLikelihood === eliminated && onlySoft) {
    return {
      ok: false,
      code: 'eliminated-without-design-change',
      message:
        'Warnings, signage, procedures, training and PPE cannot make a hazard Eliminated (F); ' +
        'only a design change or engineered feature can.',
    };
  }
  return { ok: true };
}

export const HAZARD_STATUSES = ['open', 'mitigating', 'awaiting-acceptance', 'accepted', 'closed'] as const;
export type HazardStatus = (typeof HAZARD_STATUSES)[number];

export const HAZARD_STATUS_LABELS: Readonly<Record<HazardStatus, string>> = {
  open: 'Open',
  mitigating: 'Mitigating',
  'awaiting-acceptance': 'Awaiting acceptance',
  accepted: 'Accepted',
  closed: 'Closed',
};

export type TransitionKind = 'advance' | 'return' | 'reopen';

const TRANSITIONS: Readonly<Record<HazardStatus, Partial<Record<HazardStatus, TransitionKind>>>> = {
  open: { mitigating: 'advance', 'awaiting-acceptance': 'advance' },
  mitigating: { 'awaiting-acceptance': 'advance' },
  'awaiting-acceptance': { accepted: 'advance', mitigating: 'return' },
  accepted: { closed: 'advance', open: 'reopen' },
  closed: { open: 'reopen' },
};

export function isHazardStatus(value: unknown): value is HazardStatus {
  return typeof value === 'string' && (HAZARD_STATUSES as readonly string[]).includes(value);
}

/** What kind of move from -> to is, or null when it is not allowed. */
export function transitionKind(from: string, to: string): TransitionKind | null {
  if (!isHazardStatus(from) || !isHazardStatus(to)) return null;
  return TRANSITIONS[from][to] ?? null;
}

export function canTransition(from: string, to: string): boolean {
  return transitionKind(from, to) !== null;
}

/** The statuses reachable in one step from a status. */
export function nextStatuses(from: HazardStatus): HazardStatus[] {
  return HAZARD_STATUSES.filter((to) => canTransition(from, to));
}
