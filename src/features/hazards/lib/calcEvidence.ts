/**
 * Frozen calculator results in words: what was asked and what came back, each line with its unit, so a
 * reader never has to read JSON. Unknown fields (from a newer server) still show, by name.
 */
import type { CalcEvidenceData, CalcName, QuantityDistanceCalcResult } from '../../../contract/hazards';
import { SURGE_FLUIDS } from '../../../domain/calc/surge';
import { propellantName } from './labels';

export const CALC_TITLES: Record<CalcName, string> = {
  risk: 'Risk lookup',
  'propellant-mass': 'Propellant mass',
  'quantity-distance': 'Quantity-distance (blast)',
  surge: 'Valve surge (water hammer)',
  oxygen: 'Oxygen percentage',
};

export const QD_COMBINATION_LABELS: Record<string, string> = {
  'lox-alcohol': 'LOX / alcohol',
  'lox-rp1': 'LOX / kerosene (RP-1)',
  nitromethane: 'Nitromethane',
};
export const QD_SETTING_LABELS: Record<string, string> = { 'static-test-stand': 'Static test stand', 'range-launch': 'Range launch' };
export const QD_DISTANCE_LABELS: Record<keyof QuantityDistanceCalcResult['distancesM'], string> = {
  inhabitedBuilding: 'Inhabited building distance (1.2 psi)',
  publicTrafficRoute: 'Public traffic route (2.3 psi)',
  intralineUnbarricaded: 'Intraline, unbarricaded (3.5 psi)',
  intralineBarricaded: 'Intraline, barricaded (12 psi)',
};

export const fmt = (n: number, digits = 1) => n.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits });
const plain = (n: number) => n.toLocaleString('en-GB', { maximumFractionDigits: 6 });

export interface Line {
  label: string;
  value: string;
}

type Shown = { label: string; show: (v: unknown) => string };
const num = (label: string, unit: string): Shown => ({ label, show: (v) => (typeof v === 'number' ? `${plain(v)} ${unit}` : String(v)) });
const named = (label: string, names: Record<string, string> | ((v: string) => string)): Shown => ({
  label,
  show: (v) => (typeof names === 'function' ? names(String(v)) : (names[String(v)] ?? String(v))),
});
const pascals = (label: string): Shown => ({
  label,
  show: (v) => (typeof v === 'number' ? (v >= 1e6 ? `${plain(v / 1e9)} GPa` : `${plain(v)} Pa`) : String(v)),
});

const INPUTS: Record<CalcName, Record<string, Shown>> = {
  risk: {
    matrix: named('Matrix', { 'mil-std-882e': 'MIL-STD-882E' }),
    severity: named('Severity', (v) => v),
    likelihood: named('Likelihood', (v) => v),
  },
  'propellant-mass': {
    propellant: named('Propellant', propellantName),
    volumeL: num('Tank volume', 'L'),
    fillPercent: num('Fill', '%'),
    ethanolMassPercent: num('Ethanol content', '% by mass'),
  },
  'quantity-distance': {
    propellantKg: num('Total propellant mass', 'kg'),
    combination: named('Propellant combination', QD_COMBINATION_LABELS),
    setting: named('Setting', QD_SETTING_LABELS),
    tntPercent: num('TNT equivalence given', '%'),
  },
  surge: {
    fluid: named('Liquid', (v) => (SURGE_FLUIDS as Record<string, { label: string } | undefined>)[v]?.label ?? v),
    densityKgM3: num('Density', 'kg/m³'),
    waveSpeedMps: num('Wave speed', 'm/s'),
    velocityChangeMps: num('Change in flow velocity', 'm/s'),
    pipeLengthM: num('Pipe length', 'm'),
    innerDiameterM: num('Pipe inner diameter', 'm'),
    wallThicknessM: num('Pipe wall thickness', 'm'),
    pipeModulusPa: pascals('Pipe elastic modulus'),
    bulkModulusPa: pascals('Liquid bulk modulus'),
    valveTimeS: num('Valve closing time', 's'),
  },
  oxygen: { percent: num('Oxygen reading', '% by volume') },
};

function outputs(calc: CalcName, o: Record<string, unknown>): Line[] {
  const n = (k: string) => (typeof o[k] === 'number' ? (o[k] as number) : null);
  const lines: Line[] = [];
  const add = (label: string, value: string | null) => {
    if (value !== null) lines.push({ label, value });
  };
  switch (calc) {
    case 'risk':
      add('Risk level', typeof o.label === 'string' ? o.label : typeof o.level === 'string' ? o.level : null);
      break;
    case 'propellant-mass':
      add('Propellant mass', n('massKg') === null ? null : `${fmt(n('massKg')!, 2)} kg`);
      add('Density used', n('densityKgM3') === null ? null : `${fmt(n('densityKgM3')!, 1)} kg/m³`);
      break;
    case 'quantity-distance': {
      add('TNT equivalent', n('tntKg') === null ? null : `${fmt(n('tntKg')!, 2)} kg${n('tntPercentUsed') === null ? '' : ` (${fmt(n('tntPercentUsed')!, 1)} % of propellant)`}`);
      const d = (o.distancesM ?? {}) as Record<string, unknown>;
      for (const [k, label] of Object.entries(QD_DISTANCE_LABELS)) add(label, typeof d[k] === 'number' ? `${fmt(d[k] as number, 1)} m` : null);
      break;
    }
    case 'surge':
      add('Pressure rise', n('deltaPressurePa') === null ? null : `${fmt(n('deltaPressurePa')! / 1e6, 2)} MPa (${fmt(n('deltaPressurePa')! / 1e5, 1)} bar)`);
      add('Wave speed', n('waveSpeedMps') === null ? null : `${fmt(n('waveSpeedMps')!, 0)} m/s`);
      add('Closure', o.regime === 'instantaneous' ? 'Instantaneous (worst case)' : o.regime === 'gradual' ? 'Gradual' : null);
      add('Critical time 2L/c', n('criticalTimeS') === null ? null : `${fmt(n('criticalTimeS')!, 3)} s`);
      break;
    case 'oxygen':
      add(
        'OSHA classification',
        o.classification === 'deficient' ? 'Oxygen-deficient' : o.classification === 'enriched' ? 'Oxygen-enriched' : o.classification === 'normal' ? 'Normal' : null,
      );
      add('NFPA 53 (above 21 %)', typeof o.nfpa53Enriched === 'boolean' ? (o.nfpa53Enriched ? 'Enriched for fire purposes' : 'Not enriched') : null);
      break;
  }
  return lines;
}

function generic(key: string, v: unknown): Line {
  const label = key.replace(/([a-z])([A-Z])/g, '$1 $2').replace(/^./, (c) => c.toUpperCase());
  return { label, value: typeof v === 'number' ? plain(v) : typeof v === 'string' ? v : typeof v === 'boolean' ? (v ? 'Yes' : 'No') : '—' };
}

export interface DescribedCalc {
  title: string;
  inputs: Line[];
  outputs: Line[];
  sources: string[];
  cautions: string[];
  computedAt: string | null;
}

/** A frozen calculation, described for people. */
export function describeCalcEvidence(data: Partial<CalcEvidenceData>): DescribedCalc {
  const calc = data.calc as CalcName | undefined;
  const known = calc && calc in INPUTS ? calc : undefined;
  const inputs = Object.entries(data.inputs ?? {})
    .filter(([, v]) => v !== undefined && v !== null && v !== '')
    .map(([k, v]) => {
      const shown = known ? INPUTS[known][k] : undefined;
      return shown ? { label: shown.label, value: shown.show(v) } : generic(k, v);
    });
  const o = (data.outputs ?? {}) as Record<string, unknown>;
  const strings = (v: unknown) => (Array.isArray(v) ? v.filter((s): s is string => typeof s === 'string') : typeof v === 'string' ? [v] : []);
  return {
    title: known ? CALC_TITLES[known] : String(calc ?? 'Calculation'),
    inputs,
    outputs: known ? outputs(known, o) : [],
    sources: [...strings(o.sources), ...strings(o.source)],
    cautions: strings(o.cautions),
    computedAt: typeof data.computedAt === 'string' ? data.computedAt : null,
  };
}
