import { CAUTION_GOVERNING_CODE } from './caution';
import { CalcInputError, optionalNumber, requireNumber } from './errors';

export const SURGE_SOURCES = {
  joukowsky: 'Joukowsky dp = rho * c * dv (fluid-transients texts, e.g. Wylie & Streeter, Fluid Transients)',
  gradual: 'Slow valve: dp ~ rho * c * dv * (2L/c) / T (fluid-transients texts)',
  elasticPipe: 'Wave speed in an elastic pipe: c = sqrt((K/rho) / (1 + K*D/(E*e))) (fluid-transients texts)',
  kayeLaby: 'Kaye & Laby, Tables of Physical and Chemical Constants',
  crcNiosh: 'CRC Handbook / NIOSH Pocket Guide (sp. gr. 0.79)',
  nistOxygenSat: 'NIST Chemistry WebBook, oxygen, saturation properties (read in a secondary copy)',
} as const;

export const SURGE_CAUTION =
  'Surge estimate only: it ignores friction, cavitation and reflections from branches and fittings, ' +
  'and real peaks can be higher. Add it to the working pressure and compare with the rating of every part. ' +
  CAUTION_GOVERNING_CODE;

export const SURGE_NO_VALVE_TIME_CAUTION =
  'No valve time given: the instantaneous (worst-case) surge is shown.';

export interface SurgeFluid {
  label: string;
  densityKgM3: number;
  /** Speed of sound in the bulk liquid (rigid pipe). */
  soundSpeedMps: number;
  source: string;
}

export const SURGE_FLUIDS = {
  water: { label: 'Water, 20 C', densityKgM3: 998.2, soundSpeedMps: 1482.3, source: SURGE_SOURCES.kayeLaby },
  ethanol: { label: 'Ethanol, 20 C', densityKgM3: 789.3, soundSpeedMps: 1162, source: `${SURGE_SOURCES.crcNiosh}; ${SURGE_SOURCES.kayeLaby}` },
  lox: { label: 'Liquid oxygen, near boiling point', densityKgM3: 1141, soundSpeedMps: 950, source: `${SURGE_SOURCES.nistOxygenSat}; ${SURGE_SOURCES.kayeLaby}` },
} as const satisfies Record<string, SurgeFluid>;
export type SurgeFluidId = keyof typeof SURGE_FLUIDS;

export interface SurgeInput {
  fluid?: string;
  densityKgM3?: number;
  waveSpeedMps?: number;
  velocityChangeMps: number;
  pipeLengthM?: number;
  innerDiameterM?: number;
  wallThicknessM?: number;
  pipeModulusPa?: number;
  /** Liquid bulk modulus; for a named fluid it defaults to rho * c^2. */
  bulkModulusPa?: number;
  valveTimeS?: number;
}

export type SurgeRegime = 'instantaneous' | 'gradual';

export interface SurgeResult {
  deltaPressurePa: number;
  waveSpeedMps: number;
  regime: SurgeRegime;
  /** 2L/c, when the pipe length is known. */
  criticalTimeS?: number;
  cautions: string[];
}

// Bounds beyond any liquid line on a test stand; past them the input is a typo.
const LIMITS = {
  densityKgM3: { min: 0, minExclusive: true, max: 25_000 },
  waveSpeedMps: { min: 0, minExclusive: true, max: 20_000 },
  velocityChangeMps: { min: 0, max: 1_000 },
  pipeLengthM: { min: 0, minExclusive: true, max: 100_000 },
  innerDiameterM: { min: 0, minExclusive: true, max: 10 },
  wallThicknessM: { min: 0, minExclusive: true, max: 1 },
  pipeModulusPa: { min: 0, minExclusive: true, max: 2e12 },
  bulkModulusPa: { min: 0, minExclusive: true, max: 1e12 },
  valveTimeS: { min: 0, max: 3_600 },
} as const;

/** c = sqrt((K/rho) / (1 + K*D/(E*e))): wave speed slowed by a stretching pipe wall. */
export function elasticPipeWaveSpeed(p: {
  bulkModulusPa: number;
  densityKgM3: number;
  innerDiameterM: number;
  wallThicknessM: number;
  pipeModulusPa: number;
}): number {
  const K = requireNumber('bulkModulusPa', p.bulkModulusPa, LIMITS.bulkModulusPa);
  const rho = requireNumber('densityKgM3', p.densityKgM3, LIMITS.densityKgM3);
  const D = requireNumber('innerDiameterM', p.innerDiameterM, LIMITS.innerDiameterM);
  const e = requireNumber('wallThicknessM', p.wallThicknessM, LIMITS.wallThicknessM);
  const E = requireNumber('pipeModulusPa', p.pipeModulusPa, LIMITS.pipeModulusPa);
  return Math.sqrt(K / rho / (1 + (K * D) / (E * e)));
}

/** dp = rho * c * dv. */
export function joukowskyPa(densityKgM3: number, waveSpeedMps: number, velocityChangeMps: number): number {
  return densityKgM3 * waveSpeedMps * velocityChangeMps;
}

function resolveFluid(input: SurgeInput): { rho: number; c0?: number } {
  if (input.fluid !== undefined) {
    if (!(input.fluid in SURGE_FLUIDS)) throw new CalcInputError('fluid', `Unknown fluid '${input.fluid}'.`);
    if (input.densityKgM3 !== undefined || input.waveSpeedMps !== undefined) {
      throw new CalcInputError('fluid', 'Give either a named fluid or a density and wave speed, not both.');
    }
    const f = SURGE_FLUIDS[input.fluid as SurgeFluidId];
    return { rho: f.densityKgM3, c0: f.soundSpeedMps };
  }
  const rho = requireNumber('densityKgM3', input.densityKgM3, LIMITS.densityKgM3);
  return { rho, c0: optionalNumber('waveSpeedMps', input.waveSpeedMps, LIMITS.waveSpeedMps) };
}

const PIPE_FIELDS = ['innerDiameterM', 'wallThicknessM', 'pipeModulusPa'] as const;

function waveSpeed(input: SurgeInput, rho: number, c0: number | undefined): number {
  const given = PIPE_FIELDS.filter((f) => input[f] !== undefined);
  if (given.length === 0) {
    if (c0 === undefined) throw new CalcInputError('waveSpeedMps', 'Give a wave speed, or the pipe and liquid properties to compute one.');
    return c0;
  }
  const missing = PIPE_FIELDS.find((f) => input[f] === undefined);
  if (missing) throw new CalcInputError(missing, `The elastic-pipe wave speed also needs ${missing}.`);
  // c0^2 = K/rho for the bulk liquid, so a named fluid carries its own bulk modulus.
  const bulk = input.bulkModulusPa ?? (c0 === undefined ? undefined : rho * c0 * c0);
  if (bulk === undefined) throw new CalcInputError('bulkModulusPa', 'The elastic-pipe wave speed needs the liquid bulk modulus.');
  return elasticPipeWaveSpeed({
    bulkModulusPa: bulk,
    densityKgM3: rho,
    innerDiameterM: input.innerDiameterM as number,
    wallThicknessM: input.wallThicknessM as number,
    pipeModulusPa: input.pipeModulusPa as number,
  });
}

/** Pressure rise when a valve changes the flow velocity by velocityChangeMps. */
export function surge(input: SurgeInput): SurgeResult {
  const dv = requireNumber('velocityChangeMps', input.velocityChangeMps, LIMITS.velocityChangeMps);
  const { rho, c0 } = resolveFluid(input);
  const c = waveSpeed(input, rho, c0);
  const length = optionalNumber('pipeLengthM', input.pipeLengthM, LIMITS.pipeLengthM);
  const valveT = optionalNumber('valveTimeS', input.valveTimeS, LIMITS.valveTimeS);
  if (valveT !== undefined && length === undefined) {
    throw new CalcInputError('pipeLengthM', 'A valve time only matters against 2L/c: give the pipe length too.');
  }
  const criticalTimeS = length === undefined ? undefined : (2 * length) / c;
  const full = joukowskyPa(rho, c, dv);
  const cautions = valveT === undefined ? [SURGE_CAUTION, SURGE_NO_VALVE_TIME_CAUTION] : [SURGE_CAUTION];
  const base = { waveSpeedMps: c, cautions, ...(criticalTimeS === undefined ? {} : { criticalTimeS }) };
  if (valveT === undefined || criticalTimeS === undefined || valveT <= criticalTimeS) {
    return { deltaPressurePa: full, regime: 'instantaneous', ...base };
  }
  return { deltaPressurePa: (full * criticalTimeS) / valveT, regime: 'gradual', ...base };
}
