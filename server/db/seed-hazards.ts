/**
 * Demo hazards for the invented Tern Valley Rocketry Collective's Kestrel-2 (2 kN LOX / ethanol-water)
 * at Marsh End. Written through the models with history lines, as if the team had built the register.
 */
import type { Transaction } from 'sequelize';
import type { HazardPhase, HazardSystem, VerificationStatus } from '../../src/contract/hazards';
import { BUILT_IN_MATRIX_ID } from '../../src/contract/hazards';
import type { HazardStatus, MitigationKind } from '../../src/domain/hazards/mitigation';
import { MIL_STD_882E, riskLevel } from '../../src/domain/hazards/matrix';
import type { PropellantId } from '../../src/domain/propellants/library';
import { Hazard, HazardAcceptance, HazardHistory, Mitigation, MitigationEvidence, RiskMatrix, type User } from '../models';
import type { StoredMatrixDefinition } from '../models/risk-matrix.model';
import { calcSurge } from '../hazards/calc';

type M = [MitigationKind, string, string, string, VerificationStatus];

interface DemoHazard {
  title: string;
  system: HazardSystem;
  phase: HazardPhase;
  description: string;
  causes: string[];
  effects: string[];
  propellants: PropellantId[];
  energies: string[];
  initial: [string, string];
  residual?: [string, string];
  status: HazardStatus;
  mitigations: M[];
}

// Owners by demo role name; the names come from DEMO_USERS.
const SAFETY = 'Priya Halloran';
const ADMIN = 'Ines Okafor';
const CONDUCTOR = 'Marek Lindqvist';
const PROPS = 'Tomasz Reyes';
const PAD = 'Aiko Brennan';
const RANGE = 'Dev Castellano';
const DATA = 'Noor Fairweather';

const HAZARDS: DemoHazard[] = [
  {
    title: 'Fuel surge at main-valve opening into a hot regen jacket',
    system: 'feed-system',
    phase: 'firing',
    description:
      'The fuel main valve opens in about 40 ms; the ethanol-water column accelerates into the thin-walled regenerative cooling jacket, which may still be hot from a previous short run.',
    causes: ['Fast-acting ball valve', 'Long rigid fuel line from run tank to manifold', 'No surge damping'],
    effects: ['Pressure spike above jacket rating', 'Jacket or liner deformation', 'Fuel leak into the flame zone'],
    propellants: ['ethanol-water'],
    energies: ['Hydraulic (surge pressure)', 'Thermal (hot jacket)'],
    initial: ['2', 'C'],
    residual: ['2', 'D'],
    status: 'accepted',
    mitigations: [
      ['design-alteration', 'Replace the ball valve with a slow-opening actuator (opening time > 2L/c for the fuel line).', PROPS, 'Valve timing measured on cold-flow with a pressure transducer at the manifold', 'verified'],
      ['engineered-feature', 'Burst disc on the fuel manifold, rated below the jacket proof pressure.', PAD, 'Disc certificate checked against the jacket proof test record', 'verified'],
      ['procedure-ppe', 'Minimum cool-down of 10 minutes between runs before the next fuel lead.', CONDUCTOR, 'Countdown procedure step with hold', 'verified'],
    ],
  },
  {
    title: 'Chamber liner or cooling-jacket collapse',
    system: 'engine',
    phase: 'firing',
    description: 'Coolant-side pressure falling below chamber pressure, or a local hot spot, lets the inner liner buckle inwards.',
    causes: ['Fuel pressure drops during run', 'Injector streak on the wall', 'Fatigue after repeated runs'],
    effects: ['Engine burn-through', 'Hot gas jet sideways from the stand', 'Loss of the engine'],
    propellants: ['lox', 'ethanol-water'],
    energies: ['Thermal', 'Chemical (combustion)'],
    initial: ['2', 'C'],
    residual: ['2', 'D'],
    status: 'awaiting-acceptance',
    mitigations: [
      ['engineered-feature', 'Automatic shutdown when fuel-jacket pressure falls within 20 % of chamber pressure.', DATA, 'Redline trip tested with a simulated signal', 'verified'],
      ['procedure-ppe', 'Borescope the liner after every firing and log the findings.', PAD, 'Inspection record per run', 'in-progress'],
    ],
  },
  {
    title: 'LOX spill and oxygen-soaked clothing',
    system: 'ground-support',
    phase: 'propellant-loading',
    description: 'Liquid oxygen spilled while filling the run tank soaks into clothing, gloves or the ground.',
    causes: ['Fill hose disconnect under flow', 'Overfill through the vent', 'Dropped dewar'],
    effects: ['Clothing burns violently if ignited', 'Cryogenic burns', 'Oxygen-enriched air near the stand'],
    propellants: ['lox'],
    energies: ['Chemical (oxidiser)', 'Thermal (cryogenic)'],
    initial: ['1', 'D'],
    residual: ['1', 'E'],
    status: 'accepted',
    mitigations: [
      ['engineered-feature', 'Dry-break coupling on the LOX fill line and a vent routed away from the loading position.', PROPS, 'Inspection of the coupling before each fill', 'verified'],
      ['warning-device', 'Portable oxygen monitor at the loading position, alarm at 23.5 %.', SAFETY, 'Bump test before each session', 'verified'],
      ['procedure-ppe', 'After any splash, the person leaves the area and airs clothing for at least 15 minutes before going near ignition sources.', SAFETY, 'Briefed at every pre-test meeting', 'verified'],
    ],
  },
  {
    title: 'Ethanol vapour ignition at the fuel fill point',
    system: 'ground-support',
    phase: 'propellant-loading',
    description: 'Vapour from the ethanol-water blend collects around the fill funnel and run-tank vent on a warm day.',
    causes: ['Open pouring', 'Static discharge from plastic containers', 'Generator running nearby'],
    effects: ['Flash fire at the stand', 'Burns to the loading crew'],
    propellants: ['ethanol-water'],
    energies: ['Chemical (flammable vapour)', 'Electrical (static)'],
    initial: ['2', 'C'],
    status: 'mitigating',
    mitigations: [
      ['design-alteration', 'Closed transfer by pump from a bonded metal drum instead of open pouring.', PROPS, 'Transfer rig inspection', 'in-progress'],
      ['procedure-ppe', 'Bonding and grounding clip on every container before transfer.', PROPS, 'Checklist step', 'planned'],
    ],
  },
  {
    title: 'GN2 pressurant bottle or tank rupture',
    system: 'pressurant',
    phase: 'leak-check',
    description: 'The 300 bar nitrogen bottle and the run-tank pressurant line store a lot of energy close to the crew during leak checks.',
    causes: ['Damaged bottle', 'Wrong-rated fitting', 'Regulator creep'],
    effects: ['Fragments', 'Whipping hose', 'Injury to anyone within a few metres'],
    propellants: ['gn2'],
    energies: ['Pneumatic (stored pressure)'],
    initial: ['1', 'D'],
    residual: ['1', 'E'],
    status: 'awaiting-acceptance',
    mitigations: [
      ['engineered-feature', 'Relief valve downstream of the regulator set below the lowest-rated part.', PAD, 'Relief valve bench-tested and tagged', 'verified'],
      ['engineered-feature', 'Hose whip restraints on every flexible line.', PAD, 'Visual check on the pre-test walk-down', 'verified'],
      ['procedure-ppe', 'Leak checks at full pressure are done remotely; nobody near the stand above 50 % of MEOP.', CONDUCTOR, 'Procedure step', 'verified'],
    ],
  },
  {
    title: 'Hard start from accumulated propellant in the chamber',
    system: 'engine',
    phase: 'firing',
    description: 'A late ignition lets LOX and fuel pool in the chamber before they light.',
    causes: ['Igniter fails to light before the main valves open', 'Wrong valve sequence'],
    effects: ['Pressure spike', 'Injector or chamber damage', 'Fragments'],
    propellants: ['lox', 'ethanol-water'],
    energies: ['Chemical (combustion)', 'Pneumatic'],
    initial: ['2', 'C'],
    residual: ['2', 'D'],
    status: 'accepted',
    mitigations: [
      ['engineered-feature', 'Main valves interlocked on an igniter-flame sensor (thermocouple in the igniter port).', DATA, 'Interlock tested on cold-flow with igniter disabled', 'verified'],
      ['procedure-ppe', 'Valve sequence reviewed and signed before every test campaign.', CONDUCTOR, 'Signed sequence sheet', 'verified'],
    ],
  },
  {
    title: 'Premature igniter firing',
    system: 'igniter',
    phase: 'assembly',
    description: 'The pyrotechnic igniter could fire while the crew is at the stand fitting it.',
    causes: ['Stray voltage on the firing line', 'Firing box armed early', 'Radio transmitter near the leads'],
    effects: ['Burns or eye injury to the person fitting it', 'Unplanned ignition if propellant is present'],
    propellants: [],
    energies: ['Electrical', 'Chemical (pyrotechnic)'],
    initial: ['1', 'D'],
    // Still Serious: the shorting plug lowers the chance of harm little, so the test director co-signs.
    residual: ['1', 'D'],
    status: 'accepted',
    mitigations: [
      ['engineered-feature', 'Shorting plug on the igniter leads until the crew has left the stand; key-switch arming held by the conductor.', CONDUCTOR, 'Key custody log', 'verified'],
      ['procedure-ppe', 'No radios within 5 m of the igniter leads while they are unshorted.', SAFETY, 'Pre-test briefing', 'verified'],
    ],
  },
  {
    title: 'Cryogenic burns while handling LOX hardware',
    system: 'ground-support',
    phase: 'detanking',
    description: 'Cold valves, lines and the dewar neck stay cold enough to burn for a long time after detanking.',
    causes: ['Touching frosted fittings', 'Splash during drain'],
    effects: ['Cold burns to hands and face'],
    propellants: ['lox'],
    energies: ['Thermal (cryogenic)'],
    initial: ['3', 'C'],
    residual: ['3', 'D'],
    status: 'mitigating',
    mitigations: [['procedure-ppe', 'Face shield and loose cryogenic gloves for anyone handling LOX hardware.', SAFETY, 'PPE check at the loading position', 'in-progress']],
  },
  {
    title: 'Walker breaches the keep-out area during a firing',
    system: 'test-site',
    phase: 'firing',
    description: 'A public footpath passes the edge of Marsh End; walkers have crossed the field boundary before.',
    causes: ['Unmarked boundary', 'Range guard distracted'],
    effects: ['Person inside the blast and fragment distance'],
    propellants: [],
    energies: ['Blast', 'Fragments'],
    initial: ['1', 'D'],
    status: 'open',
    mitigations: [['warning-device', 'Red flag and siren before each firing, signs on the footpath.', RANGE, 'Walk-down of signs before the session', 'planned']],
  },
  {
    title: 'Lapse in cleaning for oxygen service',
    system: 'feed-system',
    phase: 'assembly',
    description: 'A fitting or valve reassembled without cleaning for oxygen service can carry oil or particles into the LOX side.',
    causes: ['Part swapped in the field', 'Wrong thread lubricant'],
    effects: ['Ignition in the LOX line', 'Valve or line fire'],
    propellants: ['lox'],
    energies: ['Chemical (oxidiser)'],
    initial: ['2', 'D'],
    residual: ['2', 'E'],
    status: 'accepted',
    mitigations: [
      ['design-selection', 'Oxygen-side parts kept as a separate cleaned, bagged and tagged kit; no field substitutions.', PROPS, 'Kit tags checked against the build sheet', 'verified'],
      ['procedure-ppe', 'Only oxygen-compatible lubricant stocked in the LOX kit.', PROPS, 'Kit audit each campaign', 'verified'],
    ],
  },
  {
    title: 'Run-tank overpressure from a stuck regulator',
    system: 'pressurant',
    phase: 'firing',
    description: 'If the dome regulator sticks open, full bottle pressure reaches the run tanks.',
    causes: ['Regulator seat contamination', 'Ice on the regulator from LOX venting'],
    effects: ['Run-tank rupture'],
    propellants: ['gn2', 'lox', 'ethanol-water'],
    energies: ['Pneumatic (stored pressure)'],
    initial: ['1', 'D'],
    residual: ['1', 'E'],
    status: 'mitigating',
    mitigations: [
      ['engineered-feature', 'Relief valve on each run tank sized for full regulator flow.', PAD, 'Flow capacity check against the regulator Cv', 'in-progress'],
      ['warning-device', 'Tank pressure redline alarm on the control console.', DATA, 'Alarm test', 'verified'],
    ],
  },
  {
    title: 'Loss of data during a firing',
    system: 'ground-support',
    phase: 'firing',
    description: 'The data logger drops samples or the link to the bunker fails mid-run.',
    causes: ['Cable damage', 'Logger buffer overrun', 'Generator brown-out'],
    effects: ['Shutdown decision made blind', 'No record to learn from'],
    propellants: [],
    energies: ['Electrical'],
    initial: ['3', 'C'],
    residual: ['3', 'D'],
    status: 'awaiting-acceptance',
    mitigations: [
      ['design-alteration', 'Logger on its own UPS; local recording at the stand as well as in the bunker.', DATA, 'Pull-the-plug test', 'verified'],
      ['engineered-feature', 'Loss of link triggers automatic safe shutdown.', DATA, 'Link-loss test on cold-flow', 'verified'],
    ],
  },
  {
    title: 'Grass fire at the test site',
    system: 'test-site',
    phase: 'firing',
    description: 'The exhaust plume and hot debris can light dry grass around the stand in late summer.',
    causes: ['Dry season', 'Hot debris from a hard start'],
    effects: ['Fire spreading across Marsh End', 'Smoke over the road'],
    propellants: ['ethanol-water'],
    energies: ['Thermal'],
    initial: ['3', 'B'],
    status: 'open',
    mitigations: [],
  },
  {
    title: 'Nitrogen asphyxiation in the equipment trailer',
    system: 'pressurant',
    phase: 'transport',
    description: 'GN2 bottles and a leaking regulator stored in the closed trailer can lower the oxygen level inside.',
    causes: ['Leaking valve on a stored bottle', 'Trailer closed overnight'],
    effects: ['Collapse without warning on entering'],
    propellants: ['gn2'],
    energies: ['Asphyxiant gas'],
    initial: ['1', 'D'],
    residual: ['1', 'E'],
    status: 'accepted',
    mitigations: [
      ['design-alteration', 'Bottles carried on an open rack outside the trailer body.', ADMIN, 'Rack fitted and inspected', 'verified'],
      ['warning-device', 'Oxygen monitor inside the trailer door, alarm below 19.5 %.', SAFETY, 'Monthly bump test', 'verified'],
    ],
  },
  {
    title: 'Transport of pressurised bottles to Marsh End',
    system: 'pressurant',
    phase: 'transport',
    description: 'Bottles travel by road in a team member\u2019s vehicle.',
    causes: ['Unsecured bottle', 'Valve not capped', 'Collision'],
    effects: ['Valve sheared off, bottle becomes a projectile'],
    propellants: ['gn2'],
    energies: ['Pneumatic (stored pressure)', 'Kinetic'],
    initial: ['1', 'E'],
    residual: ['1', 'E'],
    status: 'open',
    mitigations: [['procedure-ppe', 'Valve caps on, bottles strapped upright, windows open, no bottles left in a parked car.', ADMIN, 'Transport checklist', 'planned']],
  },
];

/** Adds the demo hazards to a freshly seeded demo team. */
export async function seedDemoHazards(teamId: number, users: User[], transaction: Transaction): Promise<void> {
  const byName = (name: string) => users.find((u) => u.name === name)!;
  const safety = byName(SAFETY);
  const admin = byName(ADMIN);
  const day = (n: number) => new Date(Date.UTC(2025, 2, 1 + n, 9, 0, 0));
  const log = (hazardId: number, who: User, field: string, before: unknown, after: unknown, at: Date) =>
    HazardHistory.create({ hazardId, userId: who.id, userName: who.name, field, before, after, createdAt: at, updatedAt: at }, { transaction });

  let number = 0;
  for (const d of HAZARDS) {
    number += 1;
    const created = day(number);
    const h = await Hazard.create(
      {
        teamId,
        number,
        title: d.title,
        system: d.system,
        phase: d.phase,
        description: d.description,
        causes: d.causes,
        effects: d.effects,
        propellants: d.propellants,
        energies: d.energies,
        matrixId: BUILT_IN_MATRIX_ID,
        initialSeverity: d.initial[0],
        initialLikelihood: d.initial[1],
        residualSeverity: d.residual?.[0] ?? null,
        residualLikelihood: d.residual?.[1] ?? null,
        status: d.status,
        createdById: safety.id,
        createdAt: created,
        updatedAt: day(number + 20),
      },
      { transaction },
    );
    await log(h.id, safety, 'created', null, { code: `HZ-${String(number).padStart(3, '0')}`, title: d.title }, created);
    for (const [kind, description, owner, verificationMethod, verificationStatus] of d.mitigations) {
      const mit = await Mitigation.create({ hazardId: h.id, kind, description, owner, verificationMethod, verificationStatus }, { transaction });
      await log(h.id, safety, `mitigation:${mit.id}`, null, { kind, description, owner }, day(number + 2));
      // The surge hazard carries the frozen Joukowsky estimate that justified the slow valve.
      if (number === 1 && kind === 'design-alteration') {
        const inputs = { fluid: 'ethanol', velocityChangeMps: 2.2 };
        await MitigationEvidence.create(
          {
            mitigationId: mit.id,
            kind: 'calc',
            label: 'Joukowsky surge, instantaneous valve, 2.2 m/s fuel line velocity',
            data: { calc: 'surge', inputs, outputs: { ...calcSurge(inputs) }, computedAt: day(number + 3).toISOString() },
            createdById: safety.id,
          },
          { transaction },
        );
      }
    }
    if (d.residual) {
      await log(h.id, safety, 'residualSeverity', null, Number(d.residual[0]), day(number + 5));
      await log(h.id, safety, 'residualLikelihood', null, d.residual[1], day(number + 5));
    }
    const path: HazardStatus[] =
      d.status === 'open' ? [] : d.status === 'mitigating' ? ['mitigating'] : d.status === 'awaiting-acceptance' ? ['mitigating', 'awaiting-acceptance'] : ['mitigating', 'awaiting-acceptance', 'accepted'];
    let from: HazardStatus = 'open';
    for (const [i, to] of path.entries()) {
      if (to === 'accepted') {
        const level = riskLevel(MIL_STD_882E, d.residual![0], d.residual![1]).key;
        const signers = level === 'high' || level === 'serious' ? [safety, admin] : [safety];
        for (const signer of signers) {
          const role = signer === safety ? 'safety' : 'admin';
          await HazardAcceptance.create(
            { hazardId: h.id, userId: signer.id, userName: signer.name, role, riskLevel: level, createdAt: day(number + 12), updatedAt: day(number + 12) },
            { transaction },
          );
          await log(h.id, signer, 'acceptance', null, { role, riskLevel: level }, day(number + 12));
        }
      }
      await log(h.id, to === 'accepted' ? lastSigner(residualKey(d), safety, admin) : safety, 'status', from, to, day(number + 6 + i * 3));
      from = to;
    }
  }
}

/**
 * A small team matrix the demo team drafted for walk-round checks of the site, not yet used by any hazard
 * (so it can still be edited). Invented wording; colours and shapes from the palette.
 */
export const DEMO_TEAM_MATRIX: { key: string; name: string; definition: StoredMatrixDefinition } = {
  key: 'marsh-end-site-checks',
  name: 'Marsh End site checks, 3 × 3',
  definition: {
    severities: [
      { key: 'S1', label: 'Serious', description: 'Injury needing hospital care, or the stand out of use' },
      { key: 'S2', label: 'Minor', description: 'First-aid injury or repairable damage' },
      { key: 'S3', label: 'Slight', description: 'No injury; a nuisance or a delay' },
    ],
    likelihoods: [
      { key: 'L1', label: 'Likely', description: 'Expected on most test days' },
      { key: 'L2', label: 'Possible', description: 'Has happened at Marsh End or a similar site' },
      { key: 'L3', label: 'Unlikely', description: 'Not expected over the life of the stand' },
    ],
    levels: [
      { key: 'stop', label: 'Stop', rank: 3, colour: '#A3172C', nightColour: '#FF7A66', glyph: 'octagon' },
      { key: 'review', label: 'Review', rank: 2, colour: '#7A5C00', nightColour: '#D9B36A', glyph: 'diamond' },
      { key: 'proceed', label: 'Proceed', rank: 1, colour: '#2B6A4E', nightColour: '#C9A48C', glyph: 'circle' },
    ],
    cells: {
      L1: { S1: 'stop', S2: 'stop', S3: 'review' },
      L2: { S1: 'stop', S2: 'review', S3: 'proceed' },
      L3: { S1: 'review', S2: 'proceed', S3: 'proceed' },
    },
    acceptanceMap: { stop: ['safety', 'admin'], review: ['safety'], proceed: ['safety'] },
  },
};

export async function seedDemoMatrix(teamId: number, users: User[], transaction: Transaction): Promise<void> {
  const safety = users.find((u) => u.name === SAFETY)!;
  await RiskMatrix.create({ teamId, key: DEMO_TEAM_MATRIX.key, name: DEMO_TEAM_MATRIX.name, definition: DEMO_TEAM_MATRIX.definition, createdById: safety.id }, { transaction });
}

function residualKey(d: DemoHazard): string {
  return d.residual ? riskLevel(MIL_STD_882E, d.residual[0], d.residual[1]).key : 'unknown';
}

// Whoever completes the signatures moves the hazard to accepted.
function lastSigner(lvl: string, safety: User, admin: User): User {
  return lvl === 'high' || lvl === 'serious' ? admin : safety;
}
