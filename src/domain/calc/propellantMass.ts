import { getProperty, isPropellantId, type Basis, type PropellantId } from '../propellants/library';
import { ethanolWaterDensity, DENSITY_SOURCES } from './density';
import { CalcInputError, requireNumber } from './errors';

/** Propellants whose load mass we can work out from a volume. */
export const MASS_PROPELLANTS = ['lox', 'ethanol', 'ethanol-water', 'kerosene', 'ipa', 'ln2'] as const;
export type MassPropellant = (typeof MASS_PROPELLANTS)[number];

export interface PropellantMassInput {
  propellant: string;
  volumeL: number;
  fillPercent: number;
  /** Required for 'ethanol-water'; ignored otherwise. */
  ethanolMassPercent?: number;
}

export interface PropellantMassResult {
  massKg: number;
  densityKgM3: number;
  source: string;
  basis: Basis;
}

export const PROPELLANT_MASS_SOURCES = {
  ethanolWater: `${DENSITY_SOURCES.perrySecondary}, interpolated (rows between the found points are from memory)`,
} as const;

/** Why the load mass is an estimate: the density is for one temperature. */
export const PROPELLANT_MASS_CAUTION =
  'Mass uses a density at one reference temperature (20 C, or the normal boiling point for cryogens). ' +
  'Warmer, colder or pressurised liquid differs; weigh the load where the mixture ratio matters.';

/** A tank of a million litres is far beyond any stand Holdfire serves: treat it as a typo. */
const MAX_VOLUME_L = 1_000_000;

// Which library property holds each propellant's density.
const DENSITY_KEY: Record<Exclude<MassPropellant, 'ethanol-water'>, string> = {
  lox: 'densityNbp',
  ethanol: 'density20C',
  kerosene: 'density',
  ipa: 'density20C',
  ln2: 'densityNbp',
};

function isMassPropellant(id: PropellantId): id is MassPropellant {
  return (MASS_PROPELLANTS as readonly string[]).includes(id);
}

function densityFor(id: MassPropellant, ethanolMassPercent: number | undefined) {
  if (id === 'ethanol-water') {
    if (ethanolMassPercent === undefined) {
      throw new CalcInputError('ethanolMassPercent', 'An ethanol-water blend needs its ethanol content in % by mass.');
    }
    const densityKgM3 = ethanolWaterDensity(ethanolMassPercent);
    return { densityKgM3, source: PROPELLANT_MASS_SOURCES.ethanolWater, basis: 'F2' as Basis };
  }
  const prop = getProperty(id, DENSITY_KEY[id]);
  if (!prop || typeof prop.value !== 'number') {
    throw new CalcInputError('propellant', `No density is held for ${id}.`);
  }
  return { densityKgM3: prop.value, source: prop.source, basis: prop.basis };
}

/** Mass of propellant in a tank of volumeL filled to fillPercent. */
export function propellantMass(input: PropellantMassInput): PropellantMassResult {
  const { propellant } = input;
  if (!isPropellantId(propellant)) {
    throw new CalcInputError('propellant', `Unknown propellant '${String(propellant)}'.`);
  }
  if (!isMassPropellant(propellant)) {
    throw new CalcInputError(
      'propellant',
      `${propellant} has no single liquid density here (a gas, or a liquid whose density swings with temperature); enter its mass instead.`,
    );
  }
  const volumeL = requireNumber('volumeL', input.volumeL, { min: 0, max: MAX_VOLUME_L });
  const fillPercent = requireNumber('fillPercent', input.fillPercent, { min: 0, max: 100 });
  const density = densityFor(propellant, input.ethanolMassPercent);
  const massKg = density.densityKgM3 * (volumeL / 1000) * (fillPercent / 100);
  return { massKg, ...density };
}
