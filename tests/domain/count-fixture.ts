/**
 * A count of the Kestrel-2 hot fire at Marsh End, run the way the server runs one: before each command, and
 * whenever time passes, the events the clock made due are appended; then `decide` answers the command.
 */
import { CountSimulation, type CountPlan, type PlanStep, type SimPerson } from '../../src/domain/count';

/** A fixed instant: the count is created here and started a minute later. */
export const CREATED = 1_750_000_000_000;
export const START = CREATED + 60_000;
/** Server time `seconds` after the start. */
export const at = (seconds: number) => START + seconds * 1000;

function step(partial: Partial<PlanStep> & Pick<PlanStep, 'key' | 'kind' | 'station' | 'instruction'>, phase = 'terminal'): PlanStep {
  return {
    phaseKey: phase,
    phaseName: phase === 'safing' ? 'Safing' : 'Terminal count',
    index: 0,
    tSeconds: null,
    unit: null,
    min: null,
    max: null,
    stations: [],
    durationSeconds: null,
    cautions: [],
    ppe: [],
    ...partial,
  };
}

export function kestrelPlan(overrides: Partial<CountPlan> = {}): CountPlan {
  const steps = [
    step({ key: 's1', kind: 'action', station: 'TC', instruction: 'Announce the start of the count on the loop', tSeconds: -1800 }),
    step({ key: 's2', kind: 'verification', station: 'PROP', instruction: 'Verify LOX vent valve open' }),
    step({ key: 's3', kind: 'reading', station: 'PROP', instruction: 'LOX tank pressure', tSeconds: -1200, unit: 'bar', min: 2, max: 14 }),
    step({ key: 's4', kind: 'builtInHold', station: 'TC', instruction: 'Built-in hold: keep-out sweep', tSeconds: -900, durationSeconds: 600 }),
    step({ key: 's5', kind: 'poll', station: 'TC', instruction: 'Go/no-go for terminal count', tSeconds: -600, stations: ['PROP', 'RANGE', 'DAQ'] }),
    step({ key: 's6', kind: 'action', station: 'DAQ', instruction: 'Start data recording', tSeconds: -300 }),
    step({ key: 's7', kind: 'action', station: 'TC', instruction: 'Enter terminal count', tSeconds: -60 }),
    step({ key: 's8', kind: 'action', station: 'TC', instruction: 'Fire command', tSeconds: 0 }),
    step({ key: 's9', kind: 'verification', station: 'PROP', instruction: 'Confirm engine shutdown', tSeconds: 10 }),
    step({ key: 'x1', kind: 'action', station: 'PROP', instruction: 'Vent the LOX tank', tSeconds: null }, 'safing'),
    step({ key: 'x2', kind: 'verification', station: 'TC', instruction: 'Declare the stand safe', tSeconds: null }, 'safing'),
  ].map((s, index) => ({ ...s, index }));
  return {
    name: 'Kestrel-2 hot fire 3',
    procedureId: 7,
    revisionId: 21,
    revisionNumber: 3,
    steps,
    safingPhaseKeys: ['safing'],
    crew: [
      { station: 'TC', userIds: [1], names: ['Ines Marlow'] },
      { station: 'PROP', userIds: [2], names: ['Tobias Renk'] },
      { station: 'RANGE', userIds: [3], names: ['Aiyana Cole'] },
      { station: 'DAQ', userIds: [4], names: ['Pim Okafor'] },
    ],
    startTSeconds: -1800,
    terminalCountSeconds: -60,
    recycleToSeconds: -600,
    windowEnd: null,
    pollTimeoutSeconds: 60,
    ...overrides,
  };
}

export type Person = SimPerson;

export const conductor: Person = { userId: 1, name: 'Ines Marlow', roles: ['conductor'], mans: ['TC'] };
export const prop: Person = { userId: 2, name: 'Tobias Renk', roles: ['operator'], mans: ['PROP'] };
export const range: Person = { userId: 3, name: 'Aiyana Cole', roles: ['operator'], mans: ['RANGE'] };
export const daq: Person = { userId: 4, name: 'Pim Okafor', roles: ['operator'], mans: ['DAQ'] };
export const safety: Person = { userId: 5, name: 'Ruth Aldane', roles: ['safety'], mans: [] };
export const auditor: Person = { userId: 6, name: 'Colm Vesey', roles: ['auditor'], mans: [] };

export class Sim extends CountSimulation {
  constructor(plan: CountPlan = kestrelPlan()) {
    super(plan, { userId: 1, name: 'Ines Marlow' }, CREATED);
  }

  /** Start at START and get through the poll at T-10:00 with everyone go (the poll opens at START + 1800 s). */
  toAfterPoll(): this {
    this.ok(conductor, { type: 'count:start' }, START);
    this.ok(conductor, { type: 'step:complete', stepKey: 's1' }, at(5));
    this.ok(prop, { type: 'step:complete', stepKey: 's2' }, at(10));
    this.ok(prop, { type: 'reading:record', stepKey: 's3', value: 9.5 }, at(610));
    this.advance(at(1800));
    const pollId = this.state.poll!.pollId;
    for (const who of [prop, range, daq]) this.ok(who, { type: 'poll:answer', pollId, station: who.mans[0], answer: 'go' }, at(1810));
    return this;
  }
}
