/**
 * Plain input errors for the calculators. No zod here: src/domain stays
 * dependency-free, and callers need the offending field to point a form at it.
 */
export class CalcInputError extends Error {
  readonly field: string;

  constructor(field: string, message: string) {
    super(message);
    this.name = 'CalcInputError';
    this.field = field;
  }
}

/** Thrown when a TNT equivalence is asked for a combination no standard lists. */
export class UnlistedCombinationError extends CalcInputError {
  constructor(message: string) {
    super('combination', message);
    this.name = 'UnlistedCombinationError';
  }
}

export interface NumberRule {
  /** Smallest allowed value (inclusive unless minExclusive). */
  min: number;
  minExclusive?: boolean;
  /** Largest allowed value (inclusive): above it the input is a typo, not a tank. */
  max: number;
}

/**
 * Checks one numeric input and returns it. NaN and Infinity are refused
 * outright: they would otherwise flow through the arithmetic silently.
 */
export function requireNumber(field: string, value: unknown, rule: NumberRule): number {
  if (typeof value !== 'number' || Number.isNaN(value)) {
    throw new CalcInputError(field, `${field} must be a number.`);
  }
  if (!Number.isFinite(value)) {
    throw new CalcInputError(field, `${field} must be finite.`);
  }
  const belowMin = rule.minExclusive ? value <= rule.min : value < rule.min;
  if (belowMin) {
    const bound = rule.minExclusive ? `greater than ${rule.min}` : `at least ${rule.min}`;
    throw new CalcInputError(field, `${field} must be ${bound} (got ${value}).`);
  }
  if (value > rule.max) {
    throw new CalcInputError(field, `${field} must be at most ${rule.max} (got ${value}).`);
  }
  return value;
}

/** Like requireNumber, but undefined passes through as undefined. */
export function optionalNumber(field: string, value: unknown, rule: NumberRule): number | undefined {
  return value === undefined ? undefined : requireNumber(field, value, rule);
}
