import { describe, expect, it } from 'vitest';
import { buildPlanSteps, guessSafingPhaseKeys, reachTimes, restartHoldDrafts, type PhaseWithCautions } from '../../src/domain/count';
import { at, conductor, kestrelPlan, Sim, START } from './count-fixture';

const base = { hazardIds: [], propellants: [], note: '' };

describe('the plan', () => {
  const phases: PhaseWithCautions[] = [
    {
      key: 'prep',
      name: 'Propellant loading',
      steps: [
        { ...base, key: 'a', kind: 'action', tSeconds: -1800, station: 'PROP', instruction: 'Open the LOX fill valve' },
        {
          ...base,
          key: 'b',
          kind: 'reading',
          tSeconds: null,
          station: 'PROP',
          instruction: 'LOX tank pressure',
          unit: 'bar',
          min: 2,
          max: 14,
          cautions: [{ level: 'warning', text: 'Stand clear of the vent stack.', sources: [{ type: 'step' }] }],
          ppe: ['face shield'],
        },
      ],
    },
    {
      key: 'safe',
      name: 'Safing',
      steps: [{ ...base, key: 'c', kind: 'poll', tSeconds: null, station: 'TC', instruction: 'Stand safe?', stations: ['PROP'] }],
    },
  ];

  it('flattens phases into one ordered list with the fields of each kind', () => {
    const steps = buildPlanSteps(phases);
    expect(steps.map((s) => [s.key, s.index, s.phaseKey])).toEqual([
      ['a', 0, 'prep'],
      ['b', 1, 'prep'],
      ['c', 2, 'safe'],
    ]);
    expect(steps[1]).toMatchObject({ unit: 'bar', min: 2, max: 14, stations: [], durationSeconds: null, ppe: ['face shield'] });
    expect(steps[1].cautions).toEqual([{ kind: 'warning', text: 'Stand clear of the vent stack.', source: 'step note' }]);
    expect(steps[2].stations).toEqual(['PROP']);
    expect(guessSafingPhaseKeys(phases)).toEqual(['safe']);
  });

  it('reaches an untimed step with the step before it, and steps before the start at the start', () => {
    const times = reachTimes(kestrelPlan({ startTSeconds: -1500 }));
    expect([...times.entries()]).toEqual([
      ['s1', -1500],
      ['s2', -1500],
      ['s3', -1200],
      ['s4', -900],
      ['s5', -600],
      ['s6', -300],
      ['s7', -60],
      ['s8', 0],
      ['s9', 10],
    ]);
  });
});

describe('after a server restart', () => {
  it('a counting count is held; a holding one is left as it is', () => {
    const sim = new Sim();
    sim.ok(conductor, { type: 'count:start' }, START);
    const drafts = restartHoldDrafts(sim.state);
    expect(drafts).toHaveLength(1);
    sim.append(drafts, at(100));
    expect(sim.state.hold).toMatchObject({ source: 'restart', calledAtT: -1700 });
    expect(restartHoldDrafts(sim.state)).toEqual([]);
  });
});
