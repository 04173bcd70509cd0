/**
 * Propellant and pressurant library: a few physical properties with their
 * sources, handling cautions and PPE. Values carry a basis so a screen can
 * say how sure we are: F found in the named source, F2 found in a secondary
 * copy, M from memory (unchecked), D derived by arithmetic.
 */

export type Basis = 'F' | 'F2' | 'M' | 'D';

export const PROPELLANT_IDS = [
  'lox',
  'ethanol',
  'ethanol-water',
  'kerosene',
  'ipa',
  'n2o',
  'ln2',
  'gn2',
  'helium',
] as const;
export type PropellantId = (typeof PROPELLANT_IDS)[number];

export type PropellantRole = 'oxidiser' | 'fuel' | 'pressurant' | 'inert-cryogen';
export type PhysicalState = 'cryogenic-liquid' | 'liquid' | 'liquefied-gas' | 'compressed-gas';

export interface PropertyValue {
  key: string;
  label: string;
  /** A number, or an inclusive [low, high] range where the source gives one. */
  value: number | readonly [number, number];
  unit: string;
  source: string;
  basis: Basis;
}

/** 'warning' = can harm people; 'caution' = can harm equipment. */
export type CautionSeverity = 'warning' | 'caution';

export interface HandlingCaution {
  key: string;
  severity: CautionSeverity;
  text: string;
  /** Where the caution comes from; "common practice, no source" for a trade rule of thumb. */
  source: string;
}

/** One item of protective equipment, with where the advice comes from. */
export interface PpeItem {
  text: string;
  source: string;
}

export interface Propellant {
  id: PropellantId;
  name: string;
  role: PropellantRole;
  state: PhysicalState;
  properties: readonly PropertyValue[];
  cautions: readonly HandlingCaution[];
  ppe: readonly PpeItem[];
}

export const PROPELLANT_SOURCES = {
  nistOxygen: 'NIST Chemistry WebBook, oxygen (read in a secondary copy)',
  nistOxygenSat: 'NIST Chemistry WebBook, oxygen, saturation properties (read in a secondary copy)',
  expansionHandbook: 'common handbook figure (CGA P-1 / compressed gas handbooks)',
  kayeLaby: 'Kaye & Laby, Tables of Physical and Chemical Constants',
  crcNiosh: 'CRC Handbook / NIOSH Pocket Guide (sp. gr. 0.79)',
  nioshEthanol: 'NIOSH Pocket Guide to Chemical Hazards, ethyl alcohol',
  niosh: 'NIOSH Pocket Guide',
  nioshN2o: 'NIOSH Pocket Guide (51.3 atm)',
  nist: 'NIST',
  nistNitrogen: 'NIST Chemistry WebBook, nitrogen (from memory, not checked against the source)',
  gasHandbooks: 'compressed gas handbooks',
  perrySecondary: "Perry's Chemical Engineers' Handbook, ethanol-water table",
  toolboxFlash: 'Engineering ToolBox table; basis (mass or volume %) unclear',
  cleaning: 'CGA G-4.1; ASTM G93',
  keroseneDensity: 'derived from the NIOSH Pocket Guide specific gravity 0.81',
  memory: 'from memory',
  practice: 'common practice, no source',
  oxygenThresholds: 'OSHA 29 CFR 1910.146(b); NFPA 53',
  oxygenDeficient: 'OSHA 29 CFR 1910.146(b) (oxygen-deficient below 19.5 %)',
} as const;

const S = PROPELLANT_SOURCES;

/** Flash point of ethanol-water blends by ethanol content; the table does not say mass or volume %. */
export const ETHANOL_WATER_FLASH_POINTS: readonly { ethanolPercent: number; flashPointC: number }[] = [
  { ethanolPercent: 5, flashPointC: 62 },
  { ethanolPercent: 10, flashPointC: 49 },
  { ethanolPercent: 20, flashPointC: 36 },
  { ethanolPercent: 30, flashPointC: 29 },
  { ethanolPercent: 40, flashPointC: 26 },
  { ethanolPercent: 50, flashPointC: 24 },
  { ethanolPercent: 60, flashPointC: 22 },
  { ethanolPercent: 70, flashPointC: 21 },
  { ethanolPercent: 80, flashPointC: 20 },
  { ethanolPercent: 90, flashPointC: 17 },
  { ethanolPercent: 96, flashPointC: 17 },
];
export const ETHANOL_WATER_FLASH_POINTS_SOURCE = { source: S.toolboxFlash, basis: 'F2' as Basis };

// Cautions shared by several substances, written once so the wording stays consistent.
const CRYO_BURN: HandlingCaution = {
  key: 'cryogenic-burn',
  severity: 'warning',
  text:
    'Extremely cold liquid and vapour freeze skin and eyes on contact, and cold metal sticks to bare skin. ' +
    'Splashes can run into gloves and boots and stay there.',
  source: S.practice,
};
const TRAPPED_LIQUID: HandlingCaution = {
  key: 'trapped-cryogen',
  severity: 'warning',
  text:
    'Liquid trapped between two closed valves boils and builds pressure until something bursts. ' +
    'Every section that can be closed off needs a relief device.',
  source: S.practice,
};
const COLD_EMBRITTLEMENT: HandlingCaution = {
  key: 'cold-embrittlement',
  severity: 'caution',
  text:
    'Ordinary carbon steel and many plastics turn brittle at cryogenic temperatures and can crack. ' +
    'Use parts rated for the temperature.',
  source: S.practice,
};
const ASPHYXIATION: HandlingCaution = {
  key: 'asphyxiation',
  severity: 'warning',
  text:
    'The gas has no smell and displaces air. In a pit, trailer or closed room it can lower the oxygen ' +
    'level enough to cause collapse without warning. Ventilate and measure oxygen before entering.',
  source: S.oxygenDeficient,
};
const STORED_PRESSURE: HandlingCaution = {
  key: 'stored-pressure',
  severity: 'warning',
  text:
    'Cylinders and pressurised lines store a lot of energy. A broken valve or fitting can turn a cylinder ' +
    'or a part into a projectile and a loose hose can whip. Chain cylinders upright, cap them for moving, ' +
    'and vent a line before opening it.',
  source: S.practice,
};
const REGULATOR_RATING: HandlingCaution = {
  key: 'component-rating',
  severity: 'caution',
  text:
    'Regulators, hoses and gauges must be rated for the full source pressure, not just the set pressure.',
  source: S.practice,
};
const FLAMMABLE_STATIC: HandlingCaution = {
  key: 'static-ignition',
  severity: 'warning',
  text:
    'Pouring and pumping build static charge. Bond and ground containers and hoses before transferring.',
  source: S.practice,
};
const INVISIBLE_FLAME: HandlingCaution = {
  key: 'invisible-flame',
  severity: 'warning',
  text: 'Alcohol burns with a flame that is nearly invisible in daylight; a person can walk into it.',
  source: S.practice,
};

const CRYO_PPE: readonly PpeItem[] = [
  { text: 'Face shield over safety glasses', source: S.practice },
  { text: 'Loose-fitting insulated cryogenic gloves that can be thrown off quickly', source: S.practice },
  { text: 'Long sleeves; long trousers worn outside the boots', source: S.practice },
  { text: 'Closed, non-absorbent footwear', source: S.practice },
];

const SOLVENT_PPE: readonly PpeItem[] = [
  { text: 'Chemical splash goggles', source: S.practice },
  { text: 'Chemical-resistant gloves suited to the liquid', source: S.practice },
  { text: 'Flame-resistant clothing, no synthetic fabrics that melt', source: S.practice },
];

const GAS_PPE: readonly PpeItem[] = [
  { text: 'Safety glasses', source: S.practice },
  { text: 'Leather work gloves for handling cylinders', source: S.practice },
  { text: 'Safety footwear for moving cylinders', source: S.practice },
  { text: 'Personal oxygen monitor when working in enclosed spaces', source: S.practice },
];

const lox: Propellant = {
  id: 'lox',
  name: 'Liquid oxygen',
  role: 'oxidiser',
  state: 'cryogenic-liquid',
  properties: [
    { key: 'normalBoilingPoint', label: 'Normal boiling point', value: 90.19, unit: 'K', source: S.nistOxygen, basis: 'F2' },
    { key: 'densityNbp', label: 'Density at normal boiling point', value: 1141, unit: 'kg/m3', source: S.nistOxygenSat, basis: 'F2' },
    { key: 'expansionRatio', label: 'Liquid-to-gas expansion at 20 C, 1 atm (about 1:860)', value: 860, unit: 'gas volumes per liquid volume', source: S.expansionHandbook, basis: 'F2' },
    { key: 'speedOfSound', label: 'Speed of sound at -186 C', value: 950, unit: 'm/s', source: S.kayeLaby, basis: 'F' },
  ],
  cautions: [
    CRYO_BURN,
    {
      key: 'oxygen-enriched-atmosphere',
      severity: 'warning',
      text:
        'Boil-off makes the air around the stand oxygen-rich. In it, clothing, hair, grease and many ' +
        'materials that barely burn in normal air catch fire easily and burn fiercely. Keep ignition ' +
        'sources away and measure the oxygen level.',
      source: S.oxygenThresholds,
    },
    {
      key: 'oxygen-soaked-clothing',
      severity: 'warning',
      text:
        'Clothing soaked with oxygen vapour or splashed with liquid stays dangerously flammable for a long time. ' +
        'Do not smoke or go near flames or sparks until it has aired out thoroughly in open air.',
      source: S.practice,
    },
    {
      key: 'clean-for-oxygen',
      severity: 'warning',
      text:
        'Oil, grease, particles, fibres and solvent residue can ignite in oxygen and start a metal fire. ' +
        'Clean every wetted part for oxygen service (CGA G-4.1, ASTM G93) and keep it sealed until assembly; ' +
        'use only oxygen-compatible lubricants and seals.',
      source: S.cleaning,
    },
    {
      key: 'organic-surfaces',
      severity: 'warning',
      text:
        'Liquid oxygen soaked into asphalt, wood or oily ground can ignite or explode when struck or stepped on. ' +
        'Handle it over clean concrete or metal and keep fuels away from spills.',
      source: S.practice,
    },
    TRAPPED_LIQUID,
    COLD_EMBRITTLEMENT,
  ],
  ppe: [...CRYO_PPE, { text: 'Clean clothing free of oil and grease; cotton or flame-resistant, no synthetics', source: S.practice }],
};

const ethanol: Propellant = {
  id: 'ethanol',
  name: 'Ethanol',
  role: 'fuel',
  state: 'liquid',
  properties: [
    { key: 'density20C', label: 'Density at 20 C', value: 789.3, unit: 'kg/m3', source: S.crcNiosh, basis: 'F' },
    { key: 'flashPoint', label: 'Flash point', value: 13, unit: 'C', source: S.nioshEthanol, basis: 'F' },
    { key: 'lel', label: 'Lower explosive limit in air', value: 3.3, unit: '% by volume', source: S.niosh, basis: 'F' },
    { key: 'uel', label: 'Upper explosive limit in air', value: 19, unit: '% by volume', source: S.niosh, basis: 'F' },
    { key: 'rel', label: 'Exposure limit (REL and PEL, TWA)', value: 1000, unit: 'ppm', source: S.niosh, basis: 'F' },
    { key: 'speedOfSound', label: 'Speed of sound at 20 C', value: 1162, unit: 'm/s', source: S.kayeLaby, basis: 'F' },
  ],
  cautions: [
    {
      key: 'flammable-vapour',
      severity: 'warning',
      text:
        'Gives off flammable vapour at ordinary temperatures (flash point 13 C). Vapour is heavier than air ' +
        'and can travel along the ground to a spark.',
      source: S.nioshEthanol,
    },
    INVISIBLE_FLAME,
    FLAMMABLE_STATIC,
  ],
  ppe: SOLVENT_PPE,
};

const ethanolWater: Propellant = {
  id: 'ethanol-water',
  name: 'Ethanol-water blend',
  role: 'fuel',
  state: 'liquid',
  properties: [
    { key: 'density75Mass20C', label: 'Density at 75 % ethanol by mass, 20 C', value: 856, unit: 'kg/m3', source: S.perrySecondary, basis: 'F2' },
    { key: 'flashPoint70', label: 'Flash point at 70 % ethanol (mass or volume % not stated)', value: 21, unit: 'C', source: S.toolboxFlash, basis: 'F2' },
  ],
  cautions: [
    {
      key: 'flammable-vapour',
      severity: 'warning',
      text:
        'Blends used as engine fuel still give off flammable vapour at room temperature. Adding water raises ' +
        'the flash point only slowly: a blend with a quarter water is nearly as easy to ignite as pure ethanol.',
      source: S.toolboxFlash,
    },
    {
      key: 'blend-density',
      severity: 'caution',
      text:
        'Mixing ethanol and water shrinks the total volume. Work out loads from the blend density table, ' +
        'not from the pure liquids, or the mixture ratio will be off.',
      source: S.perrySecondary,
    },
    INVISIBLE_FLAME,
    FLAMMABLE_STATIC,
  ],
  ppe: SOLVENT_PPE,
};

const kerosene: Propellant = {
  id: 'kerosene',
  name: 'Kerosene / RP-1',
  role: 'fuel',
  state: 'liquid',
  properties: [
    { key: 'flashPoint', label: 'Flash point', value: [38, 72], unit: 'C', source: S.niosh, basis: 'F' },
    { key: 'lel', label: 'Lower explosive limit in air', value: 0.7, unit: '% by volume', source: S.niosh, basis: 'F' },
    { key: 'uel', label: 'Upper explosive limit in air', value: 5, unit: '% by volume', source: S.niosh, basis: 'F' },
    { key: 'specificGravity', label: 'Specific gravity', value: 0.81, unit: '(water = 1)', source: S.niosh, basis: 'F' },
    { key: 'density', label: 'Density (specific gravity x 1000 kg/m3)', value: 810, unit: 'kg/m3', source: S.keroseneDensity, basis: 'D' },
  ],
  cautions: [
    {
      key: 'spray-ignition',
      severity: 'warning',
      text:
        'Liquid at room temperature is hard to light, but a spray or mist from a leak ignites well below ' +
        'the flash point. Treat any leak under pressure as a fire hazard.',
      source: S.practice,
    },
    {
      key: 'skin-contact',
      severity: 'warning',
      text: 'Strips oils from skin and irritates it on repeated contact; keep it off skin and out of eyes.',
      source: S.practice,
    },
    {
      key: 'oxygen-side-contamination',
      severity: 'caution',
      text:
        'Kerosene residue on oxygen-cleaned parts ruins their cleanliness. Keep separate tools, ' +
        'rags and hoses for the fuel and oxygen sides.',
      source: S.practice,
    },
    FLAMMABLE_STATIC,
  ],
  ppe: SOLVENT_PPE,
};

const ipa: Propellant = {
  id: 'ipa',
  name: 'Isopropyl alcohol',
  role: 'fuel',
  state: 'liquid',
  properties: [
    { key: 'density20C', label: 'Density at 20 C', value: 786, unit: 'kg/m3', source: S.memory, basis: 'M' },
    { key: 'flashPoint', label: 'Flash point', value: 12, unit: 'C', source: S.niosh, basis: 'F' },
    { key: 'lel', label: 'Lower explosive limit in air', value: 2.0, unit: '% by volume', source: S.niosh, basis: 'F' },
    { key: 'uel', label: 'Upper explosive limit in air', value: 12.7, unit: '% by volume', source: S.niosh, basis: 'F' },
  ],
  cautions: [
    {
      key: 'flammable-vapour',
      severity: 'warning',
      text: 'Gives off flammable vapour at ordinary temperatures (flash point 12 C); keep sparks and flames away.',
      source: S.niosh,
    },
    INVISIBLE_FLAME,
    FLAMMABLE_STATIC,
  ],
  ppe: SOLVENT_PPE,
};

const n2o: Propellant = {
  id: 'n2o',
  name: 'Nitrous oxide',
  role: 'oxidiser',
  state: 'liquefied-gas',
  properties: [
    { key: 'vapourPressure20C', label: 'Vapour pressure at 20 C (about 5.1-5.2 MPa)', value: [5.1, 5.2], unit: 'MPa', source: S.nioshN2o, basis: 'F' },
    { key: 'criticalTemperature', label: 'Critical temperature', value: 309.57, unit: 'K', source: S.nist, basis: 'F' },
    { key: 'criticalPressure', label: 'Critical pressure', value: 7.245, unit: 'MPa', source: S.nist, basis: 'F' },
    { key: 'rel', label: 'Exposure limit (REL, TWA over the time exposed)', value: 25, unit: 'ppm', source: S.niosh, basis: 'F' },
  ],
  cautions: [
    {
      key: 'decomposition',
      severity: 'warning',
      text:
        'Nitrous oxide can break down violently on its own, with no fuel present, once started by heat, ' +
        'a fast pressure rise (slamming a valve), a flame front or contamination. The breakdown can run ' +
        'back through lines into the tank and burst it. Open valves slowly and keep the system clean.',
      source: S.practice,
    },
    {
      key: 'pressure-rises-with-temperature',
      severity: 'warning',
      text:
        'A tank of liquid nitrous holds about 5 MPa at room temperature and the pressure climbs steeply as it warms; ' +
        'above about 36 C it is all supercritical fluid. Keep tanks out of the sun and never overfill.',
      source: `${S.nioshN2o}; ${S.nist}`,
    },
    {
      key: 'oxidiser',
      severity: 'warning',
      text:
        'It feeds fire strongly. Clean wetted parts for oxygen service (CGA G-4.1, ASTM G93) and keep oil and grease off them.',
      source: S.cleaning,
    },
    {
      key: 'anaesthetic',
      severity: 'warning',
      text:
        'Breathing the gas causes drowsiness and loss of judgement and, in a closed space, suffocation. ' +
        'Vent outdoors, away from people.',
      source: S.practice,
    },
    {
      key: 'cold-release',
      severity: 'warning',
      text: 'Liquid flashing to gas at a leak or vent gets cold enough to freeze skin.',
      source: S.practice,
    },
  ],
  ppe: [
    { text: 'Face shield over safety glasses', source: S.practice },
    { text: 'Insulated gloves for connecting and venting', source: S.practice },
    { text: 'Long sleeves, clean clothing free of oil and grease', source: S.practice },
  ],
};

const ln2: Propellant = {
  id: 'ln2',
  name: 'Liquid nitrogen',
  role: 'inert-cryogen',
  state: 'cryogenic-liquid',
  properties: [
    { key: 'normalBoilingPoint', label: 'Normal boiling point', value: 77.36, unit: 'K', source: S.nistNitrogen, basis: 'M' },
    { key: 'densityNbp', label: 'Density at normal boiling point', value: 806, unit: 'kg/m3', source: S.nistNitrogen, basis: 'M' },
    { key: 'expansionRatio', label: 'Liquid-to-gas expansion (about 1:696)', value: 696, unit: 'gas volumes per liquid volume', source: S.gasHandbooks, basis: 'F2' },
  ],
  cautions: [
    CRYO_BURN,
    ASPHYXIATION,
    {
      key: 'condensed-oxygen',
      severity: 'warning',
      text:
        'Surfaces colder than liquid oxygen condense oxygen out of the air. The drips are oxygen-rich and ' +
        'make nearby materials burn fiercely, just as with liquid oxygen.',
      source: S.practice,
    },
    TRAPPED_LIQUID,
    COLD_EMBRITTLEMENT,
  ],
  ppe: CRYO_PPE,
};

const gn2: Propellant = {
  id: 'gn2',
  name: 'Gaseous nitrogen',
  role: 'pressurant',
  state: 'compressed-gas',
  properties: [
    { key: 'molarMass', label: 'Molar mass', value: 28.01, unit: 'g/mol', source: S.memory, basis: 'M' },
  ],
  cautions: [ASPHYXIATION, STORED_PRESSURE, REGULATOR_RATING],
  ppe: GAS_PPE,
};

const helium: Propellant = {
  id: 'helium',
  name: 'Helium',
  role: 'pressurant',
  state: 'compressed-gas',
  properties: [
    { key: 'molarMass', label: 'Molar mass', value: 4.003, unit: 'g/mol', source: S.memory, basis: 'M' },
  ],
  cautions: [
    ASPHYXIATION,
    STORED_PRESSURE,
    REGULATOR_RATING,
    {
      key: 'leaks',
      severity: 'caution',
      text: 'Helium slips through fittings and seals that are tight for other gases; leak-check at working pressure before a test.',
      source: S.practice,
    },
  ],
  ppe: GAS_PPE,
};

export const PROPELLANTS: Readonly<Record<PropellantId, Propellant>> = {
  lox,
  ethanol,
  'ethanol-water': ethanolWater,
  kerosene,
  ipa,
  n2o,
  ln2,
  gn2,
  helium,
};

export function isPropellantId(value: unknown): value is PropellantId {
  return typeof value === 'string' && (PROPELLANT_IDS as readonly string[]).includes(value);
}

/** The propellant with this id, or undefined. */
export function getPropellant(id: string): Propellant | undefined {
  return isPropellantId(id) ? PROPELLANTS[id] : undefined;
}

/** One property of a propellant, or undefined when the library holds no value. */
export function getProperty(id: PropellantId, key: string): PropertyValue | undefined {
  return PROPELLANTS[id].properties.find((p) => p.key === key);
}

/** The cautions of one severity, warnings (harm to people) usually shown first. */
export function cautionsBySeverity(id: PropellantId, severity: CautionSeverity): HandlingCaution[] {
  return PROPELLANTS[id].cautions.filter((c) => c.severity === severity);
}
