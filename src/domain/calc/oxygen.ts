import { CAUTION_GOVERNING_CODE } from './caution';
import { requireNumber } from './errors';

export const OXYGEN_SOURCES = {
  osha: 'OSHA 29 CFR 1910.146(b)',
  nfpa53: 'NFPA 53',
} as const;

/** % oxygen by volume. OSHA: deficient below 19.5, enriched above 23.5. */
export const OSHA_DEFICIENT_BELOW = 19.5;
export const OSHA_ENRICHED_ABOVE = 23.5;
/** NFPA 53 counts any atmosphere above 21 % as oxygen-enriched for fire purposes. */
export const NFPA53_ENRICHED_ABOVE = 21;

export const OXYGEN_CAUTION =
  'A single reading describes one place at one moment; oxygen and boil-off pool in low spots. ' +
  CAUTION_GOVERNING_CODE;

export type OxygenClassification = 'deficient' | 'normal' | 'enriched';

export interface OxygenResult {
  classification: OxygenClassification;
  /** True above 21 %: OSHA may call it normal while the fire code already calls it enriched. */
  nfpa53Enriched: boolean;
  cautions: string[];
}

export function classifyOxygen(percent: number): OxygenResult {
  const p = requireNumber('percent', percent, { min: 0, max: 100 });
  const classification: OxygenClassification =
    p < OSHA_DEFICIENT_BELOW ? 'deficient' : p > OSHA_ENRICHED_ABOVE ? 'enriched' : 'normal';
  return { classification, nfpa53Enriched: p > NFPA53_ENRICHED_ABOVE, cautions: [OXYGEN_CAUTION] };
}
