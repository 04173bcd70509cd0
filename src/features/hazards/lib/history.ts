/**
 * Hazard history entries in words. The server keeps each change as field + before + after
 * (raw values, so nothing is lost); this turns them into what an auditor reads.
 */
import { HAZARD_STATUS_LABELS, MITIGATION_KIND_INFO, isMitigationKind, type HazardStatus } from '../../../domain/hazards/mitigation';
import { ROLE_LABELS, type Role } from '../../../domain/people/roles';
import { PHASE_LABELS, SYSTEM_LABELS, VERIFICATION_LABELS, propellantName } from './labels';
import { likelihoodText, severityText } from './risk';

const FIELD_WORDS: Record<string, string> = {
  created: 'Hazard recorded',
  title: 'Title',
  system: 'System',
  phase: 'Phase',
  description: 'Description',
  causes: 'Causes',
  effects: 'Effects',
  propellants: 'Propellants',
  energies: 'Energies',
  initialSeverity: 'Initial severity',
  initialLikelihood: 'Initial likelihood',
  residualSeverity: 'Residual severity',
  residualLikelihood: 'Residual likelihood',
  matrixId: 'Risk matrix',
  status: 'Status',
  acceptance: 'Acceptance signed',
  acceptances: 'Acceptances cleared',
  anomaly: 'Anomaly linked',
};

const MITIGATION_FIELD_WORDS: Record<string, string> = {
  kind: 'kind',
  description: 'what is done',
  owner: 'owner',
  verificationMethod: 'how it is verified',
  verificationStatus: 'verification',
  evidence: 'evidence',
};

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const text = (v: unknown): string => (typeof v === 'string' ? v : v === null || v === undefined ? '' : JSON.stringify(v));

function parseField(field: string): { mitigationId: string | null; sub: string | null } {
  const m = /^mitigation:(\d+)(?:\.(.+))?$/.exec(field);
  return m ? { mitigationId: m[1], sub: m[2] ?? null } : { mitigationId: null, sub: null };
}

/** The "Field" column: "Residual severity", "Mitigation 3: owner". */
export function historyFieldName(field: string): string {
  const { mitigationId, sub } = parseField(field);
  if (mitigationId) return sub ? `Mitigation ${mitigationId}: ${MITIGATION_FIELD_WORDS[sub] ?? sub}` : `Mitigation ${mitigationId}`;
  return FIELD_WORDS[field] ?? field.charAt(0).toUpperCase() + field.slice(1);
}

/** Built-in keys get their word ("2 Critical"); a team matrix key is shown as it is. */
function axisText(key: string, describe: (k: string) => string): string {
  const t = describe(key);
  return t === `${key} ${key}` ? key : t;
}

function statusWord(v: unknown): string {
  return HAZARD_STATUS_LABELS[v as HazardStatus] ?? text(v);
}

function mitigationSummary(m: Obj): string {
  const kind = isMitigationKind(m.kind) ? MITIGATION_KIND_INFO[m.kind].label : text(m.kind);
  const parts = [`${kind}: ${text(m.description)}`];
  if (m.owner) parts.push(`owner ${text(m.owner)}`);
  if (m.verificationMethod) parts.push(`verified by ${text(m.verificationMethod)}`);
  if (m.verificationStatus) parts.push(`verification ${VERIFICATION_LABELS[m.verificationStatus as keyof typeof VERIFICATION_LABELS] ?? text(m.verificationStatus)}`);
  return parts.join('; ');
}

function evidenceSummary(e: Obj): string {
  const label = text(e.label) || 'Evidence';
  if (typeof e.calc === 'string') return `${label} (frozen ${e.calc} calculation)`;
  const name = text(e.name ?? e.fileName ?? e.originalName);
  return name ? `${label} (file ${name})` : label;
}

function listOf(v: unknown, each: (s: string) => string = (s) => s): string {
  return Array.isArray(v) ? v.map((x) => each(text(x))).join('; ') : text(v);
}

/** One side (before or after) of a history entry, in words. "—" for nothing. */
export function historyValue(field: string, value: unknown): string {
  if (value === null || value === undefined || value === '' || (Array.isArray(value) && value.length === 0)) return '—';
  const { mitigationId, sub } = parseField(field);
  if (mitigationId) {
    if (!sub && isObj(value)) return mitigationSummary(value);
    if (sub === 'kind' && isMitigationKind(value)) return MITIGATION_KIND_INFO[value].label;
    if (sub === 'verificationStatus') return VERIFICATION_LABELS[value as keyof typeof VERIFICATION_LABELS] ?? text(value);
    if (sub === 'evidence' && isObj(value)) return evidenceSummary(value);
  }
  switch (field) {
    case 'initialSeverity':
    case 'residualSeverity':
      return axisText(text(value), severityText);
    case 'initialLikelihood':
    case 'residualLikelihood':
      return axisText(text(value), likelihoodText);
    case 'system':
      return SYSTEM_LABELS[value as keyof typeof SYSTEM_LABELS] ?? text(value);
    case 'phase':
      return PHASE_LABELS[value as keyof typeof PHASE_LABELS] ?? text(value);
    case 'propellants':
      return listOf(value, propellantName);
    case 'status':
      if (isObj(value)) return value.note ? `${statusWord(value.status)}; note: ${text(value.note)}` : statusWord(value.status);
      return statusWord(value);
    case 'created':
      if (isObj(value)) return [text(value.code), text(value.title)].filter(Boolean).join(' ');
      break;
    case 'acceptance':
      if (isObj(value)) {
        const role = ROLE_LABELS[value.role as Role] ?? text(value.role);
        return value.riskLevel ? `as ${role}, for a ${text(value.riskLevel)} residual risk` : `as ${role}`;
      }
      break;
    case 'acceptances':
      if (Array.isArray(value)) {
        return value.map((a) => (isObj(a) ? `${text(a.userName)} as ${ROLE_LABELS[a.role as Role] ?? text(a.role)}` : text(a))).join('; ');
      }
      if (isObj(value) && value.cleared) return `Cleared: ${text(value.cleared)}`;
      break;
  }
  if (Array.isArray(value)) return listOf(value);
  if (isObj(value)) {
    return Object.entries(value)
      .map(([k, v]) => `${k}: ${text(v)}`)
      .join('; ');
  }
  return String(value);
}
