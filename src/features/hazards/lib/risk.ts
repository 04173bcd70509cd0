import { MIL_STD_882E, riskLevel, type RiskLevel, type RiskMatrix } from '../../../domain/hazards/matrix';

/** The team's matrix. Only the built-in one exists for now. */
export const MATRIX: RiskMatrix = MIL_STD_882E;

/** Level for a severity/likelihood pair, or null while either is missing or unknown. */
export function levelFor(severity: string | null | undefined, likelihood: string | null | undefined): RiskLevel | null {
  if (!severity || !likelihood) return null;
  try {
    return riskLevel(MATRIX, severity, likelihood);
  } catch {
    return null;
  }
}

const KNOWN = new Set(['high', 'serious', 'medium', 'low', 'eliminated']);

/** One of the fixed swatch classes in styles.css; unknown (team-defined) levels fall back to the neutral one. */
export function levelClass(levelKey: string): string {
  return KNOWN.has(levelKey) ? `hf-risk hf-risk-${levelKey}` : 'hf-risk';
}

export function severityLabel(key: string): string {
  return MATRIX.severities.find((s) => s.key === key)?.label ?? key;
}

export function likelihoodLabel(key: string): string {
  return MATRIX.likelihoods.find((l) => l.key === key)?.label ?? key;
}

/** "2 Critical" / "C Occasional": the key people quote plus the word. */
export function severityText(key: string): string {
  return `${key} ${severityLabel(key)}`;
}
export function likelihoodText(key: string): string {
  return `${key} ${likelihoodLabel(key)}`;
}
