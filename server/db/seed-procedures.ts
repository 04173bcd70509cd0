/**
 * Demo stations, crew plan and the Kestrel-2 static-fire procedure for the invented Tern Valley Rocketry
 * Collective at Marsh End. Every value is invented for the demo (plausible for a 2 kN LOX / ethanol-water
 * engine) and is not guidance for a real stand.
 */
import type { Transaction } from 'sequelize';
import type { PropellantId } from '../../src/domain/propellants/library';
import type { PersonnelCheck, Phase, Step } from '../../src/domain/procedures/steps';
import { normaliseStep, validatePhases } from '../../src/domain/procedures/steps';
import { parseTMinus } from '../../src/domain/procedures/tminus';
import { hazardCode } from '../hazards/hazards';
import { CrewAssignment, CrewPlan, Hazard, Procedure, ProcedureRevision, ProcedureSignoff, Station, type User } from '../models';
import { cautionContext, currentCautions } from '../procedures/procedures';

const CRYO_PPE = [
  'Face shield over safety glasses',
  'Loose insulated cryogenic gloves',
  'Long sleeves; trousers outside the boots',
  'Clean cotton or flame-resistant clothing, free of oil and grease',
];

export const DEMO_STATIONS = [
  { code: 'TC', name: 'Test conductor', callSign: 'Control', defaultPpe: ['Hearing protection', 'High-visibility vest'] },
  { code: 'PROP', name: 'Propellants', callSign: 'Props', defaultPpe: CRYO_PPE },
  { code: 'PAD', name: 'Pad systems', callSign: 'Pad', defaultPpe: ['Safety glasses', 'Leather work gloves', 'Safety footwear', 'Hearing protection'] },
  { code: 'DATA', name: 'Data and instrumentation', callSign: 'Data', defaultPpe: ['Hearing protection'] },
  { code: 'RANGE', name: 'Range and perimeter', callSign: 'Range', defaultPpe: ['High-visibility vest', 'Hearing protection'] },
  { code: 'SAFE', name: 'Safety officer', callSign: 'Safety', defaultPpe: ['Safety glasses', 'High-visibility vest', 'Personal oxygen monitor'] },
  { code: 'FIRE', name: 'Fire and medical', callSign: 'Rescue', defaultPpe: ['Flame-resistant coverall', 'Fire gloves', 'Face shield'] },
];

const EVERY_STATION = ['PROP', 'PAD', 'DATA', 'RANGE', 'SAFE', 'FIRE'];

// Step builders: `at` is a count time ('T-30:00') or null for an untimed step that follows the one before.
type Common = { hz?: number[]; prop?: PropellantId[]; note?: string };
function base(key: string, at: string | null, station: string, instruction: string, c: Common = {}) {
  const tSeconds = at === null ? null : parseTMinus(at);
  if (tSeconds === undefined) throw new Error(`demo step ${key}: bad time ${at}`);
  // Hazard numbers become ids once the register is known; see withHazardIds.
  return { key, tSeconds, station, instruction, hazardIds: c.hz ?? [], propellants: c.prop ?? [], note: c.note ?? '' };
}
const action = (key: string, at: string | null, station: string, instruction: string, c?: Common): Step => ({ ...base(key, at, station, instruction, c), kind: 'action' });
const verify = (key: string, at: string | null, station: string, instruction: string, c?: Common): Step => ({ ...base(key, at, station, instruction, c), kind: 'verification' });
const reading = (key: string, at: string | null, station: string, instruction: string, unit: string, min: number | null, max: number | null, c?: Common): Step => ({
  ...base(key, at, station, instruction, c),
  kind: 'reading',
  unit,
  min,
  max,
});
const poll = (key: string, at: string | null, instruction: string, stations: string[], c?: Common): Step => ({ ...base(key, at, 'TC', instruction, c), kind: 'poll', stations });
const hold = (key: string, at: string, minutes: number, instruction: string, c?: Common): Step => ({
  ...base(key, at, 'TC', instruction, c),
  kind: 'builtInHold',
  durationSeconds: minutes * 60,
});
const people = (key: string, at: string | null, station: string, instruction: string, checks: PersonnelCheck[], zone: string, c?: Common): Step => ({
  ...base(key, at, station, instruction, c),
  kind: 'personnelCheck',
  checks,
  zone,
});

// Hazard numbers of the demo register (server/db/seed-hazards.ts).
const HZ = {
  surge: 1,
  liner: 2,
  loxSpill: 3,
  fuelVapour: 4,
  gn2: 5,
  hardStart: 6,
  igniter: 7,
  cryoBurn: 8,
  walker: 9,
  o2Clean: 10,
  overpressure: 11,
  data: 12,
  grassFire: 13,
} as const;

const STAND = 'Stand area inside the 30 m rope';
const KEEP_OUT = 'Keep-out area to the marked field boundary';

/** Revision 1: the procedure as released. */
function revisionOne(): Phase[] {
  return [
    {
      key: 'pad-setup',
      name: 'Pad set-up',
      steps: [
        action('brief', 'T-2:00:00', 'TC', 'Crew briefing at the bunker: objectives of the run, stations and call signs, the abort call, the muster point and the route to the hospital. Review the readings and redlines of this procedure.', {
          hz: [HZ.loxSpill, HZ.igniter],
          note: 'Anyone may call a hold at any time, for any reason. Nobody is asked to justify a hold during the count.',
        }),
        people('headcount-1', null, 'TC', 'Head count against the crew plan. Sign-in sheet complete; visitors named, briefed and escorted.', ['head-count'], 'Bunker'),
        reading('wind', 'T-1:55:00', 'SAFE', 'Read the wind at the stand mast. Above the limit the vent and plume drift onto the bunker: no-go.', 'm/s', null, 10),
        action('flag-up', null, 'RANGE', 'Red flag up at the field gate. Warning signs out at both ends of the footpath. Path clear both ways.', { hz: [HZ.walker] }),
        verify('walkdown', 'T-1:50:00', 'PAD', 'Stand walk-down: GN2 bottle chained upright, whip restraints on every flexible line, relief valves tagged, no tools, rags or loose items on the stand.', {
          hz: [HZ.gn2, HZ.overpressure],
        }),
        verify('igniter-safe', null, 'PAD', 'Igniter shorting plug fitted; firing box shows SAFE; the firing key is in the test conductor\u2019s pocket.', { hz: [HZ.igniter] }),
        action('logger-on', 'T-1:45:00', 'DATA', 'Logger and stand recorder on (logger on its UPS). Start recording at the stand and in the bunker; every channel reads ambient.', { hz: [HZ.data] }),
        verify('link-loss', null, 'DATA', 'Link-loss check: unplug the bunker link for 5 s. The stand goes to its safe state and the link alarm sounds. Reconnect and confirm the alarm clears.', {
          hz: [HZ.data],
        }),
        action('fire-setup', 'T-1:40:00', 'FIRE', 'Fire and medical point set up upwind of the stand: two powder extinguishers and the water-mist unit at the approach, burns kit and cold water for cryogenic burns, vehicle parked facing out.', {
          hz: [HZ.grassFire],
        }),
        verify('lox-kit', 'T-1:35:00', 'PROP', 'LOX kit tags match the build sheet; only oxygen-compatible lubricant in the kit; oxygen-side caps stay on until each connection is made.', {
          hz: [HZ.o2Clean],
          prop: ['lox'],
        }),
        poll('poll-leak', 'T-1:30:00', 'Go/no-go to start leak checks: pad set-up complete at every station.', EVERY_STATION),
      ],
    },
    {
      key: 'leak-checks',
      name: 'Leak checks',
      steps: [
        action('gn2-connect', 'T-1:30:00', 'PAD', 'Connect the GN2 bottle to the pressurant panel. Open the bottle valve slowly, standing to the side of the regulator.', { hz: [HZ.gn2], prop: ['gn2'] }),
        reading('gn2-bottle-1', null, 'PAD', 'Read the bottle gauge. Below the minimum there is not enough gas to pressurise, fire and purge a safe detank: change the bottle.', 'bar', 200, 300, {
          prop: ['gn2'],
        }),
        action('leak-low', 'T-1:25:00', 'PAD', 'Low-pressure leak check: regulate the run tanks and lines to 5 bar. Snoop every joint on the fuel, LOX and pressurant sides (oxygen-compatible leak fluid on the LOX side). Fix any bubble, then repeat.', {
          hz: [HZ.gn2, HZ.o2Clean],
          prop: ['gn2'],
        }),
        people('clear-hp', 'T-1:15:00', 'TC', 'Everyone off the stand and behind the bunker line before any pressure above 50 % of MEOP. Head count.', ['keep-out-clear', 'head-count'], STAND, {
          hz: [HZ.gn2],
        }),
        action('leak-high', null, 'PAD', 'Remote high-pressure leak check from the bunker: bring both run tanks to 35 bar and hold for 5 minutes. Watch the tank transducers.', {
          hz: [HZ.gn2, HZ.overpressure],
          prop: ['gn2'],
        }),
        reading('lox-decay', 'T-1:10:00', 'DATA', 'LOX run-tank pressure drop over the 5-minute hold.', 'bar', null, 0.3),
        reading('fuel-decay', null, 'DATA', 'Fuel run-tank pressure drop over the 5-minute hold.', 'bar', null, 0.3),
        action('leak-vent', 'T-1:08:00', 'PAD', 'Vent both run tanks from the bunker; both tank transducers read 0 bar before anyone goes back to the stand.', { hz: [HZ.overpressure] }),
        poll('poll-load', 'T-1:05:00', 'Go/no-go to load propellants: no leaks open, tanks vented, loading crew ready.', ['PROP', 'PAD', 'DATA', 'SAFE', 'RANGE']),
      ],
    },
    {
      key: 'loading',
      name: 'Propellant loading',
      steps: [
        people('clear-load', 'T-1:05:00', 'SAFE', 'Before loading: only the loading crew (Props, Pad and Safety) inside the rope; everyone else behind the bunker line. Head count.', ['keep-out-clear', 'head-count'], STAND, {
          hz: [HZ.loxSpill, HZ.fuelVapour],
        }),
        reading('o2-level', null, 'SAFE', 'Bump-test the personal oxygen monitors, then read the oxygen level at the loading position.', '% O2', 19.5, 23.5, { hz: [HZ.loxSpill], prop: ['lox'] }),
        verify('ppe-check', null, 'PROP', 'PPE check for the loading crew: face shield over safety glasses, loose cryogenic gloves, long sleeves, trousers outside the boots, clean cotton or flame-resistant clothing.', {
          hz: [HZ.cryoBurn],
          prop: ['lox'],
        }),
        action('fuel-bond', 'T-1:00:00', 'PROP', 'Bond and ground the fuel drum, the transfer pump and the fuel run tank. Check each clip bites on bare metal.', { hz: [HZ.fuelVapour], prop: ['ethanol-water'] }),
        action('fuel-load', null, 'PROP', 'Pump 4.0 L of the 75 % ethanol-water blend into the fuel run tank through the closed transfer line (3.4 kg on the scale). No open pouring.', {
          hz: [HZ.fuelVapour],
          prop: ['ethanol-water'],
        }),
        verify('fuel-closed', 'T-0:55:00', 'PROP', 'Fuel side closed: fill valve shut and capped, drum back in the fuel store 15 m upwind, no spills on the stand.', { hz: [HZ.fuelVapour] }),
        action('lox-chill', 'T-0:50:00', 'PROP', 'Chill-down: open the LOX fill valve a little and let LOX flow through the fill line and run tank to the vent until the vent runs liquid. Stand upwind of the vent.', {
          hz: [HZ.loxSpill, HZ.cryoBurn],
          prop: ['lox'],
        }),
        action('lox-fill', 'T-0:45:00', 'PROP', 'Fill the LOX run tank through the dry-break coupling at low flow, watching the level and the vent.', { hz: [HZ.loxSpill], prop: ['lox'] }),
        reading('lox-level', null, 'DATA', 'LOX run-tank level at the end of the fill. Above the maximum there is too little ullage for boil-off; stop in the band.', '%', 85, 95, { prop: ['lox'] }),
        action('lox-close', 'T-0:38:00', 'PROP', 'Close the LOX fill valve, disconnect the dry-break coupling and cap it. The run-tank vent stays open.', { hz: [HZ.loxSpill], prop: ['lox'] }),
        verify('clothing-1', 'T-0:36:00', 'SAFE', 'Clothing check: anyone splashed, or with frosted or cold-soaked clothing, leaves the stand and airs the clothing in the open for at least 15 minutes before going near vehicles, the generator or the firing box.', {
          hz: [HZ.loxSpill],
          prop: ['lox'],
        }),
        action('igniter-connect', 'T-0:34:00', 'PAD', 'Last person at the stand: remove the igniter shorting plug and connect the firing line. Firing box stays SAFE, key stays with the test conductor, no radio within 5 m of the leads.', {
          hz: [HZ.igniter],
        }),
        people('clear-stand', 'T-0:33:00', 'SAFE', 'Loading crew back behind the bunker line. Head count matches the crew plan.', ['keep-out-clear', 'head-count'], STAND),
        people('perimeter', 'T-0:32:00', 'RANGE', 'Perimeter walk: footpath clear both ways, field gate closed, nobody in the keep-out area.', ['keep-out-clear'], KEEP_OUT, { hz: [HZ.walker] }),
        poll('poll-terminal', 'T-0:30:00', 'Go/no-go to enter the terminal count: propellants loaded, stand clear, perimeter closed.', EVERY_STATION),
      ],
    },
    {
      key: 'terminal',
      name: 'Terminal count',
      steps: [
        hold('hold-30', 'T-30:00', 10, 'Built-in hold: let the LOX boil-off settle, review every reading so far and clear any open item before the count resumes.'),
        verify('redlines-armed', null, 'DATA', 'Automatic shutdown armed in the controller: fuel-jacket pressure margin, tank pressure limits and link loss all enabled; limits match this procedure.', {
          hz: [HZ.liner, HZ.overpressure, HZ.data],
        }),
        people('keepout-siren', 'T-25:00', 'RANGE', 'Keep-out area clear. Sound the siren: one long blast. Range closed.', ['keep-out-clear'], KEEP_OUT, { hz: [HZ.walker] }),
        action('purge-on', 'T-20:00', 'PAD', 'GN2 purge on through the injector at low flow; it stays on until the end of safing.', { prop: ['gn2'] }),
        reading('purge-pressure', null, 'PAD', 'GN2 purge supply pressure at the panel.', 'bar', 8, 12),
        action('fuel-press', 'T-15:00', 'PAD', 'Pressurise the fuel run tank from the bunker to 33 bar.', { hz: [HZ.overpressure], prop: ['gn2', 'ethanol-water'] }),
        reading('fuel-pressure', null, 'DATA', 'Fuel run-tank pressure.', 'bar', 31, 35, { hz: [HZ.overpressure] }),
        action('lox-press', 'T-12:00', 'PAD', 'Close the LOX vent and pressurise the LOX run tank to 30 bar.', { hz: [HZ.overpressure], prop: ['gn2', 'lox'] }),
        reading('lox-pressure', null, 'DATA', 'LOX run-tank pressure.', 'bar', 28, 32, { hz: [HZ.overpressure] }),
        reading('gn2-bottle-2', 'T-10:00', 'PAD', 'GN2 bottle pressure after pressurisation: enough left for the run and the detank purge.', 'bar', 150, 300, { prop: ['gn2'] }),
        hold('hold-5', 'T-5:00', 5, 'Built-in hold: last look at every reading and at the keep-out area. From here any station calls a hold on the net and the count stops.'),
        people('clear-arm', null, 'SAFE', 'Before arming: every crew member at their bunker position, head count matches the crew plan, nobody at the stand or in the keep-out area.', ['keep-out-clear', 'head-count'], KEEP_OUT, {
          hz: [HZ.igniter, HZ.walker],
        }),
        reading('igniter-continuity', 'T-3:00', 'PAD', 'Igniter continuity through the firing box\u2019s low-current tester. Outside the band: no-go, do not arm.', 'ohm', 0.8, 3.0, { hz: [HZ.igniter] }),
        poll('poll-arm', 'T-2:00', 'Final go/no-go to arm and fire.', EVERY_STATION),
      ],
    },
    {
      key: 'firing',
      name: 'Firing',
      steps: [
        action('arm', 'T-1:00', 'TC', 'Insert the firing key and arm. Call \u201cArmed\u201d on the net.', { hz: [HZ.igniter, HZ.hardStart] }),
        action('siren-final', 'T-0:30', 'RANGE', 'Siren: three short blasts. Last look across the keep-out area.', { hz: [HZ.walker] }),
        action('data-fast', 'T-0:15', 'DATA', 'Logger to high rate, cameras recording. Call \u201cData go\u201d.', { hz: [HZ.data] }),
        action('sequence-start', 'T-0:05', 'TC', 'Start the auto sequence: igniter fires; the main valves open only on the igniter-flame signal, fuel lead first, each valve opening slowly.', {
          hz: [HZ.hardStart, HZ.surge],
          note: 'For any call of \u201cabort\u201d the test conductor presses stop: the controller closes both main valves and the purge flows.',
        }),
        verify('ignition', 'T-0:00', 'DATA', 'Ignition: igniter flame confirmed, both main valves open, chamber pressure rising. Call anything abnormal at once.', { hz: [HZ.hardStart, HZ.liner] }),
        verify('shutdown', 'T+0:05', 'DATA', 'Shutdown after the 5-second run: LOX valve closed first, fuel after it, purge flowing, chamber pressure back to zero.', { hz: [HZ.liner] }),
        poll('poll-safing', 'T+0:45', 'Go/no-go to start safing: normal shutdown, no fire or leak on the cameras.', ['PAD', 'DATA', 'SAFE', 'FIRE', 'RANGE']),
      ],
    },
    {
      key: 'safing',
      name: 'Safing and detanking',
      steps: [
        action('disarm', 'T+1:00', 'TC', 'Disarm: firing key out, firing box shows SAFE. Call \u201cDisarmed\u201d.', { hz: [HZ.igniter] }),
        action('vent-all', 'T+1:30', 'PAD', 'Vent both run tanks from the bunker.', { hz: [HZ.overpressure] }),
        reading('vented', null, 'DATA', 'Highest run-tank pressure after venting. Nobody approaches above the maximum.', 'bar', null, 0.5, { hz: [HZ.overpressure] }),
        verify('fire-check', 'T+2:00', 'FIRE', 'Camera and visual check for grass fire or smouldering debris around the stand. Fire crew ready at the approach.', { hz: [HZ.grassFire] }),
        action('lox-drain', 'T+3:00', 'PAD', 'Drain the remaining LOX to the gravel boil-off pit, away from asphalt, wood and fuel. Let it boil off; do not hurry it.', {
          hz: [HZ.loxSpill, HZ.cryoBurn],
          prop: ['lox'],
        }),
        people('approach', 'T+5:00', 'SAFE', 'Approach: only Pad and Safety, in cryogenic PPE, oxygen monitors on, once the tanks read 0 bar and the fire crew is satisfied.', ['head-count'], STAND, {
          hz: [HZ.cryoBurn],
          prop: ['lox'],
        }),
        action('shorting-plug', 'T+6:00', 'PAD', 'Fit the igniter shorting plug. Drain the fuel run tank into the bonded drum and cap it.', { hz: [HZ.igniter, HZ.fuelVapour], prop: ['ethanol-water'] }),
        action('gn2-close', 'T+8:00', 'PAD', 'Close the GN2 bottle, vent the pressurant panel, purge off.', { hz: [HZ.gn2], prop: ['gn2'] }),
        verify('clothing-2', 'T+9:00', 'SAFE', 'Clothing check for everyone who approached: frosted or splashed clothing airs in the open for at least 15 minutes before going near vehicles or the generator.', {
          hz: [HZ.loxSpill],
          prop: ['lox'],
        }),
        poll('poll-open', 'T+10:00', 'Go/no-go to open the range: stand safe, tanks empty and vented.', EVERY_STATION),
        action('flag-down', null, 'RANGE', 'Red flag down, footpath signs in, siren all-clear (one long blast).', { hz: [HZ.walker] }),
      ],
    },
  ];
}

/** Revision 2, a draft: what the team changed after the first firing. */
function revisionTwo(one: Phase[]): Phase[] {
  const phases: Phase[] = structuredClone(one);
  const find = (key: string) => phases.flatMap((p) => p.steps).find((s) => s.key === key)!;
  const phase = (key: string) => phases.find((p) => p.key === key)!;

  // Gusts moved the vent plume towards the bunker at 9 m/s: the wind limit comes down.
  const wind = find('wind');
  if (wind.kind === 'reading') wind.max = 8;
  // The fill overran once: stop at the first liquid at the vent.
  find('lox-fill').instruction =
    'Fill the LOX run tank through the dry-break coupling at low flow, watching the level and the vent. Stop the fill at the first sign of liquid at the vent.';
  // The fire point goes up before anything else is unpacked.
  const setup = phase('pad-setup');
  const fire = setup.steps.splice(setup.steps.findIndex((s) => s.key === 'fire-setup'), 1)[0]!;
  fire.tSeconds = -7200;
  setup.steps.splice(2, 0, fire);
  // Camera and logger checks move earlier, out of the last minute.
  const firing = phase('firing');
  firing.steps = firing.steps.filter((s) => s.key !== 'data-fast');
  const terminal = phase('terminal');
  terminal.steps.splice(
    terminal.steps.findIndex((s) => s.key === 'gn2-bottle-2') + 1,
    0,
    action('cameras', 'T-8:00', 'DATA', 'Cameras and logger to high rate; check every camera view and that both recorders are writing. Call \u201cData go\u201d.', { hz: [HZ.data] }),
  );
  return phases;
}

function withHazardIds(phases: Phase[], idByNumber: Map<number, number>): Phase[] {
  return phases.map((p) => ({
    ...p,
    steps: p.steps.map((s) => normaliseStep({ ...s, hazardIds: s.hazardIds.map((n) => idByNumber.get(n)!).filter((id) => id !== undefined) })),
  }));
}

const at = (iso: string) => new Date(iso);

/** Adds the demo stations, procedure and crew plan to a freshly seeded demo team (after its hazards). */
export async function seedDemoProcedures(teamId: number, users: User[], transaction: Transaction): Promise<void> {
  const byName = (name: string) => users.find((u) => u.name === name)!;
  const conductor = byName('Marek Lindqvist');
  const safety = byName('Priya Halloran');

  const stations = new Map<string, Station>();
  for (const s of DEMO_STATIONS) {
    stations.set(s.code, await Station.create({ teamId, ...s, createdAt: at('2025-03-20T10:00:00Z'), updatedAt: at('2025-03-20T10:00:00Z') }, { transaction }));
  }

  const hazards = await Hazard.findAll({ where: { teamId }, transaction });
  const idByNumber = new Map(hazards.map((h) => [h.number, h.id]));
  const one = withHazardIds(revisionOne(), idByNumber);
  const two = withHazardIds(revisionTwo(revisionOne()), idByNumber);
  const refs = { stations: new Set(stations.keys()), hazardIds: new Set(hazards.map((h) => h.id)) };
  for (const [n, phases] of [one, two].entries()) {
    const problems = validatePhases(phases, refs);
    if (problems.length) throw new Error(`demo procedure revision ${n + 1}: ${problems.map((p) => `${p.path}: ${p.message}`).join('; ')}`);
  }
  // Every hazard a step links must be one of the register's, by its printed code.
  for (const n of Object.values(HZ)) if (!idByNumber.has(n)) throw new Error(`demo procedure links ${hazardCode(n)}, which is not in the register`);

  const procedure = await Procedure.create(
    {
      teamId,
      name: 'Kestrel-2 static fire',
      purpose:
        'Hot-fire the Kestrel-2 engine for a 5-second run at full thrust on the Marsh End vertical stand, recording chamber, ' +
        'tank and jacket pressures, and leave the stand safe afterwards.',
      testArticle: 'Kestrel-2, 2 kN LOX / ethanol-water, regeneratively cooled',
      site: 'Marsh End test site',
      stations: ['FIRE'],
      createdById: conductor.id,
      createdAt: at('2025-04-02T18:00:00Z'),
      updatedAt: at('2025-05-03T19:30:00Z'),
    },
    { transaction },
  );
  const rev1 = await ProcedureRevision.create(
    {
      procedureId: procedure.id,
      number: 1,
      status: 'released',
      basedOn: null,
      phases: one,
      releasedCautions: currentCautions(one, await cautionContext(teamId, transaction)),
      releasedAt: at('2025-04-20T16:10:00Z'),
      createdById: conductor.id,
      updatedById: conductor.id,
      createdAt: at('2025-04-02T18:00:00Z'),
      updatedAt: at('2025-04-20T16:10:00Z'),
    },
    { transaction },
  );
  await ProcedureSignoff.create(
    { revisionId: rev1.id, userId: conductor.id, userName: conductor.name, role: 'conductor', createdAt: at('2025-04-19T20:45:00Z'), updatedAt: at('2025-04-19T20:45:00Z') },
    { transaction },
  );
  await ProcedureSignoff.create(
    { revisionId: rev1.id, userId: safety.id, userName: safety.name, role: 'safety', createdAt: at('2025-04-20T16:10:00Z'), updatedAt: at('2025-04-20T16:10:00Z') },
    { transaction },
  );
  await ProcedureRevision.create(
    {
      procedureId: procedure.id,
      number: 2,
      status: 'draft',
      basedOn: 1,
      phases: two,
      releasedCautions: null,
      releasedAt: null,
      createdById: conductor.id,
      updatedById: conductor.id,
      createdAt: at('2025-05-03T19:00:00Z'),
      updatedAt: at('2025-05-03T19:30:00Z'),
    },
    { transaction },
  );

  const plan = await CrewPlan.create(
    {
      teamId,
      name: 'Kestrel-2 static fire, 17 May',
      procedureId: procedure.id,
      testDate: '2025-05-17',
      notes: 'Muster point: the bunker car park. Ines Okafor holds the first-aid kit and the keys to the field gate.',
    },
    { transaction },
  );
  const crew: [string, string][] = [
    ['TC', 'Marek Lindqvist'],
    ['PROP', 'Tomasz Reyes'],
    ['PAD', 'Aiko Brennan'],
    ['DATA', 'Noor Fairweather'],
    ['RANGE', 'Dev Castellano'],
    ['SAFE', 'Priya Halloran'],
    ['FIRE', 'Ines Okafor'],
  ];
  for (const [code, name] of crew) {
    await CrewAssignment.create({ crewPlanId: plan.id, stationId: stations.get(code)!.id, userId: byName(name).id }, { transaction });
  }
}
