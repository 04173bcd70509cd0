import { requireNumber } from './errors';

export type Basis = 'F' | 'F2' | 'M' | 'D';

export interface DensityPoint {
  /** Ethanol content, % by mass. */
  massPercent: number;
  /** Density of the mixture at 20 C, kg/m3. */
  densityKgM3: number;
  source: string;
  basis: Basis;
}

export const DENSITY_SOURCES = {
  perrySecondary:
    "Perry's Chemical Engineers' Handbook, ethanol-water density table at 20 C (read in a secondary copy)",
  ethanol: 'CRC Handbook / NIOSH Pocket Guide (sp. gr. 0.79)',
  memory: 'from memory',
} as const;

/** The table holds for 20 C only; blends also drift as ethanol evaporates faster than water. */
export const DENSITY_CAUTION =
  'Density is for 20 C and a blend mixed by mass. Measure the blend (hydrometer or weighing) before a test ' +
  'where the mixture ratio matters.';

const MEM = { source: DENSITY_SOURCES.memory, basis: 'M' } as const;
const PERRY = { source: DENSITY_SOURCES.perrySecondary, basis: 'F2' } as const;

/**
 * Ethanol-water density at 20 C by mass percent. Mixing shrinks the volume,
 * so the curve bows above any straight line between the pure liquids; we
 * interpolate this table rather than mix pure densities.
 * Rows marked 'M' are from memory of the handbook table and still want a
 * check against a primary copy.
 */
export const ETHANOL_WATER_DENSITY_20C: readonly DensityPoint[] = [
  { massPercent: 0, densityKgM3: 998.2, ...PERRY },
  { massPercent: 5, densityKgM3: 989.4, ...PERRY },
  { massPercent: 10, densityKgM3: 981.9, ...PERRY },
  { massPercent: 15, densityKgM3: 975.2, ...MEM },
  { massPercent: 20, densityKgM3: 968.7, ...MEM },
  { massPercent: 25, densityKgM3: 961.7, ...MEM },
  { massPercent: 30, densityKgM3: 953.9, ...MEM },
  { massPercent: 35, densityKgM3: 945.0, ...MEM },
  { massPercent: 40, densityKgM3: 935.2, ...MEM },
  { massPercent: 45, densityKgM3: 924.8, ...MEM },
  { massPercent: 50, densityKgM3: 913.9, ...MEM },
  { massPercent: 55, densityKgM3: 902.7, ...MEM },
  { massPercent: 60, densityKgM3: 891.1, ...MEM },
  { massPercent: 65, densityKgM3: 879.5, ...MEM },
  { massPercent: 70, densityKgM3: 867.6, ...MEM },
  { massPercent: 75, densityKgM3: 856.0, ...PERRY },
  { massPercent: 80, densityKgM3: 843.4, ...MEM },
  { massPercent: 85, densityKgM3: 831.0, ...MEM },
  { massPercent: 90, densityKgM3: 818.0, ...MEM },
  { massPercent: 95, densityKgM3: 804.2, ...MEM },
  { massPercent: 100, densityKgM3: 789.3, source: DENSITY_SOURCES.ethanol, basis: 'F' },
];

/** Density (kg/m3) of an ethanol-water blend at 20 C, interpolated in the table. */
export function ethanolWaterDensity(ethanolMassPercent: number): number {
  const p = requireNumber('ethanolMassPercent', ethanolMassPercent, { min: 0, max: 100 });
  const table = ETHANOL_WATER_DENSITY_20C;
  const upperIndex = table.findIndex((row) => row.massPercent >= p);
  const hi = table[upperIndex];
  if (hi.massPercent === p || upperIndex === 0) return hi.densityKgM3;
  const lo = table[upperIndex - 1];
  const t = (p - lo.massPercent) / (hi.massPercent - lo.massPercent);
  return lo.densityKgM3 + t * (hi.densityKgM3 - lo.densityKgM3);
}

/** The table rows that bracket a blend, so a screen can show where a number came from. */
export function ethanolWaterDensitySources(ethanolMassPercent: number): DensityPoint[] {
  const p = requireNumber('ethanolMassPercent', ethanolMassPercent, { min: 0, max: 100 });
  const exact = ETHANOL_WATER_DENSITY_20C.find((row) => row.massPercent === p);
  if (exact) return [exact];
  const upperIndex = ETHANOL_WATER_DENSITY_20C.findIndex((row) => row.massPercent > p);
  return [ETHANOL_WATER_DENSITY_20C[upperIndex - 1], ETHANOL_WATER_DENSITY_20C[upperIndex]];
}
