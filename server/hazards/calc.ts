/**
 * The calculators behind /api/calc and frozen evidence: one place that calls the
 * domain and turns its input errors into 400s naming the field.
 */
import type { z } from 'zod';
import type {
  CalcName,
  OxygenCalcResult,
  PropellantMassCalcResult,
  QuantityDistanceCalcResult,
  RiskCalcResult,
  SurgeCalcResult,
  oxygenQuerySchema,
  propellantMassQuerySchema,
  quantityDistanceQuerySchema,
  riskCalcQuerySchema,
  surgeQuerySchema,
} from '../../src/contract/hazards';
import { CAUTION_GOVERNING_CODE } from '../../src/domain/calc/caution';
import { DENSITY_CAUTION } from '../../src/domain/calc/density';
import { CalcInputError } from '../../src/domain/calc/errors';
import { classifyOxygen, OXYGEN_SOURCES } from '../../src/domain/calc/oxygen';
import { PROPELLANT_MASS_CAUTION, propellantMass } from '../../src/domain/calc/propellantMass';
import { QD_SOURCES, quantityDistance } from '../../src/domain/calc/quantityDistance';
import { SURGE_SOURCES, surge } from '../../src/domain/calc/surge';
import { MatrixKeyError, riskLevel } from '../../src/domain/hazards/matrix';
import { badRequest } from '../http/errors';
import { resolveMatrix } from './matrices';

type In<S extends z.ZodType> = z.output<S>;

function domainError(error: unknown): never {
  if (error instanceof CalcInputError) {
    throw badRequest(error.message, 'calc_input', [{ path: error.field, message: error.message }]);
  }
  if (error instanceof MatrixKeyError) {
    const path = error.axis === 'level' || error.axis === 'cell' ? 'matrix' : error.axis;
    throw badRequest(error.message, 'unknown_matrix_key', [{ path, message: error.message }]);
  }
  throw error;
}

function guard<T>(fn: () => T): T {
  try {
    return fn();
  } catch (error) {
    domainError(error);
  }
}

export async function calcRisk(teamId: number, q: In<typeof riskCalcQuerySchema>): Promise<RiskCalcResult> {
  const { matrix } = await resolveMatrix(teamId, q.matrix, undefined, 'matrix');
  const level = guard(() => riskLevel(matrix, q.severity, q.likelihood));
  return { matrixId: matrix.id, level: level.key, label: level.label, rank: level.rank, colour: level.colour };
}

export function calcPropellantMass(q: In<typeof propellantMassQuerySchema>): PropellantMassCalcResult {
  const r = guard(() => propellantMass(q));
  const cautions = q.propellant === 'ethanol-water' ? [PROPELLANT_MASS_CAUTION, DENSITY_CAUTION] : [PROPELLANT_MASS_CAUTION];
  return { ...r, cautions };
}

export function calcQuantityDistance(q: In<typeof quantityDistanceQuerySchema>): QuantityDistanceCalcResult {
  const r = guard(() => quantityDistance(q));
  return {
    tntKg: r.tntKg,
    tntPercentUsed: r.tntPercentUsed,
    distancesM: { ...r.distancesM },
    sources: [QD_SOURCES.tntEquivalence, QD_SOURCES.formula, QD_SOURCES.ibd, QD_SOURCES.ptr, QD_SOURCES.ilUnbarricaded, QD_SOURCES.ilBarricaded],
    cautions: r.cautions,
  };
}

export function calcSurge(q: In<typeof surgeQuerySchema>): SurgeCalcResult {
  const r = guard(() => surge(q));
  const sources: string[] = [SURGE_SOURCES.joukowsky];
  if (r.regime === 'gradual') sources.push(SURGE_SOURCES.gradual);
  if (q.innerDiameterM !== undefined) sources.push(SURGE_SOURCES.elasticPipe);
  // The domain already includes the governing-code caution; keep it guaranteed.
  const cautions = r.cautions.some((c) => c.includes(CAUTION_GOVERNING_CODE)) ? r.cautions : [...r.cautions, CAUTION_GOVERNING_CODE];
  return { ...r, sources, cautions };
}

export function calcOxygen(q: In<typeof oxygenQuerySchema>): OxygenCalcResult {
  const r = guard(() => classifyOxygen(q.percent));
  return { ...r, sources: [OXYGEN_SOURCES.osha, OXYGEN_SOURCES.nfpa53] };
}

/** Runs one named calculator; used to freeze evidence. */
export async function runCalc(teamId: number, calc: CalcName, inputs: unknown): Promise<Record<string, unknown>> {
  switch (calc) {
    case 'risk':
      return { ...(await calcRisk(teamId, inputs as In<typeof riskCalcQuerySchema>)) };
    case 'propellant-mass':
      return { ...calcPropellantMass(inputs as In<typeof propellantMassQuerySchema>) };
    case 'quantity-distance':
      return { ...calcQuantityDistance(inputs as In<typeof quantityDistanceQuerySchema>) };
    case 'surge':
      return { ...calcSurge(inputs as In<typeof surgeQuerySchema>) };
    case 'oxygen':
      return { ...calcOxygen(inputs as In<typeof oxygenQuerySchema>) };
  }
}
