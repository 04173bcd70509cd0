import { CAUTION_GOVERNING_CODE } from './caution';
import { CalcInputError, UnlistedCombinationError, optionalNumber, requireNumber } from './errors';

export const QD_COMBINATIONS = ['lox-alcohol', 'lox-rp1', 'nitromethane'] as const;
export type QdCombination = (typeof QD_COMBINATIONS)[number];

export const QD_SETTINGS = ['static-test-stand', 'range-launch'] as const;
export type QdSetting = (typeof QD_SETTINGS)[number];

export const QD_SOURCES = {
  tntEquivalence: 'DoD 6055.9-STD / DESR 6055.09; NASA-STD-8719.12 (TNT equivalence of liquid propellants)',
  formula: 'DoD 6055.9-STD / DESR 6055.09: D = K * W^(1/3), D in ft, W in lb TNT',
  ibd: 'K = 40 ft/lb^(1/3), 1.2 psi, inhabited building distance (NSWC, Swisdak)',
  ptr: 'K = 24 ft/lb^(1/3), 2.3 psi, public traffic route (60 % of IBD)',
  ilUnbarricaded: 'K = 18 ft/lb^(1/3), 3.5 psi, intraline unbarricaded',
  ilBarricaded: 'K = 9 ft/lb^(1/3), 12 psi, intraline barricaded',
} as const;

/** Blast-only K factors, and the deference every distance must carry. */
export const QD_CAUTION =
  'K factors cover blast only: fragments and heat may need larger distances, and the standards set ' +
  'minimum distances not shown here. ' +
  CAUTION_GOVERNING_CODE;

export const USER_TNT_CAUTION =
  'The TNT equivalence was entered by hand. It must come from an individual hazard assessment for this combination.';

/** K factors in ft/lb^(1/3), as the standards give them. */
export const K_FT_PER_LB_CBRT = {
  inhabitedBuilding: 40,
  publicTrafficRoute: 24,
  intralineUnbarricaded: 18,
  intralineBarricaded: 9,
} as const;
export type QdDistanceKind = keyof typeof K_FT_PER_LB_CBRT;

/** 1 ft/lb^(1/3) = 0.3967 m/kg^(1/3). */
export const FT_PER_LB_CBRT_TO_M_PER_KG_CBRT = 0.3967;

/** Exact by definition of the international pound. */
export const KG_PER_LB = 0.45359237;

/** Range-launch breakpoint: 20 % applies up to 500,000 lb of propellant, 10 % to the excess. */
export const RANGE_LAUNCH_BREAK_KG = 500_000 * KG_PER_LB;

/** Ten thousand tonnes of propellant is beyond any launch vehicle: treat as a typo. */
const MAX_PROPELLANT_KG = 10_000_000;
/** Above any listed liquid propellant; a bigger entry is almost surely a slip (common practice, no source). */
const MAX_TNT_PERCENT = 200;

export interface QuantityDistanceInput {
  propellantKg: number;
  combination?: string;
  setting?: string;
  /** From an individual hazard assessment; overrides the listed equivalence. */
  tntPercent?: number;
}

export interface QuantityDistanceResult {
  tntKg: number;
  /** Overall TNT equivalence, % of total propellant mass. */
  tntPercentUsed: number;
  distancesM: Record<QdDistanceKind, number>;
  cautions: string[];
}

export function isQdCombination(value: unknown): value is QdCombination {
  return typeof value === 'string' && (QD_COMBINATIONS as readonly string[]).includes(value);
}

/** K in m/kg^(1/3) for one distance kind. */
export function kMetric(kind: QdDistanceKind): number {
  return K_FT_PER_LB_CBRT[kind] * FT_PER_LB_CBRT_TO_M_PER_KG_CBRT;
}

/** D = K * W^(1/3) with K in m/kg^(1/3) and W in kg TNT. */
export function scaledDistanceM(kMPerKgCbrt: number, tntKg: number): number {
  return kMPerKgCbrt * Math.cbrt(tntKg);
}

function requireSetting(setting: string | undefined): QdSetting {
  if (setting === undefined) {
    throw new CalcInputError('setting', 'Say whether this is a static test stand or a range launch: the equivalence differs.');
  }
  if (!(QD_SETTINGS as readonly string[]).includes(setting)) {
    throw new CalcInputError('setting', `Unknown setting '${setting}'.`);
  }
  return setting as QdSetting;
}

/** TNT equivalent mass (kg) for a listed combination. */
export function listedTntKg(propellantKg: number, combination: QdCombination, setting?: string): number {
  if (combination === 'nitromethane') return propellantKg;
  if (requireSetting(setting) === 'static-test-stand') return 0.1 * propellantKg;
  const first = Math.min(propellantKg, RANGE_LAUNCH_BREAK_KG);
  const excess = Math.max(0, propellantKg - RANGE_LAUNCH_BREAK_KG);
  return 0.2 * first + 0.1 * excess;
}

function tntKgFor(propellantKg: number, input: QuantityDistanceInput, userPercent: number | undefined): number {
  if (userPercent !== undefined) return (propellantKg * userPercent) / 100;
  const { combination } = input;
  if (!isQdCombination(combination)) {
    const named = combination === undefined ? 'No combination was given' : `'${combination}' is not a listed combination`;
    throw new UnlistedCombinationError(
      `${named}. The standards give no TNT equivalence for it: enter one from an individual hazard assessment.`,
    );
  }
  return listedTntKg(propellantKg, combination, input.setting);
}

/** Blast quantity-distances for a propellant load. */
export function quantityDistance(input: QuantityDistanceInput): QuantityDistanceResult {
  const propellantKg = requireNumber('propellantKg', input.propellantKg, { min: 0, minExclusive: true, max: MAX_PROPELLANT_KG });
  const userPercent = optionalNumber('tntPercent', input.tntPercent, { min: 0, minExclusive: true, max: MAX_TNT_PERCENT });
  const tntKg = tntKgFor(propellantKg, input, userPercent);
  const distancesM = {} as Record<QdDistanceKind, number>;
  for (const kind of Object.keys(K_FT_PER_LB_CBRT) as QdDistanceKind[]) {
    distancesM[kind] = scaledDistanceM(kMetric(kind), tntKg);
  }
  const cautions = userPercent === undefined ? [QD_CAUTION] : [QD_CAUTION, USER_TNT_CAUTION];
  return { tntKg, tntPercentUsed: (100 * tntKg) / propellantKg, distancesM, cautions };
}
