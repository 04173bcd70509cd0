import { describe, expect, it } from 'vitest';
import {
  referenceProblems,
  sequenceProblems,
  stepProblems,
  validatePhases,
  type Phase,
  type Step,
} from '../../src/domain/procedures/steps';

// Holdfire's own authoring rules (issue #4): times never decrease down the list, built-in holds have a length,
// polls name their stations, readings have a unit and at least one limit.
const base = { tSeconds: null, station: 'TC', instruction: 'Do the thing.', hazardIds: [], propellants: [], note: '' };
const action = (key: string, tSeconds: number | null): Step => ({ ...base, key, kind: 'action', tSeconds });
const phase = (key: string, steps: Step[], name = key): Phase => ({ key, name, steps });
const paths = (problems: { path: string }[]) => problems.map((p) => p.path);

describe('stepProblems', () => {
  it('accepts a well-formed step of each kind', () => {
    const steps: Step[] = [
      { ...base, key: 'a', kind: 'action' },
      { ...base, key: 'b', kind: 'verification' },
      { ...base, key: 'c', kind: 'reading', unit: 'bar', min: 20, max: 24 },
      { ...base, key: 'd', kind: 'reading', unit: '%', min: 95, max: null },
      { ...base, key: 'e', kind: 'poll', stations: ['PROP', 'PAD'] },
      { ...base, key: 'f', kind: 'builtInHold', tSeconds: -1800, durationSeconds: 600 },
      { ...base, key: 'g', kind: 'personnelCheck', checks: ['keep-out-clear'], zone: '' },
    ];
    for (const s of steps) expect(stepProblems(s), s.kind).toEqual([]);
  });

  it('a reading needs a unit and at least one limit, and min <= max', () => {
    const r = (unit: string, min: number | null, max: number | null): Step => ({ ...base, key: 'r', kind: 'reading', unit, min, max });
    expect(paths(stepProblems(r('', 1, 2)))).toEqual(['unit']);
    expect(stepProblems(r('bar', null, null))[0]).toMatchObject({ path: 'min', message: expect.stringMatching(/at least one limit/) });
    expect(stepProblems(r('bar', 25, 24))[0]).toMatchObject({ path: 'max', message: expect.stringMatching(/below the minimum/) });
    // Equal limits are a single permitted value: allowed.
    expect(stepProblems(r('bar', 24, 24))).toEqual([]);
    expect(stepProblems(r('bar', null, 0))).toEqual([]);
  });

  it('a poll names at least one station, each once', () => {
    expect(paths(stepProblems({ ...base, key: 'p', kind: 'poll', stations: [] }))).toEqual(['stations']);
    expect(paths(stepProblems({ ...base, key: 'p', kind: 'poll', stations: ['PAD', 'DATA', 'PAD'] }))).toEqual(['stations.2']);
  });

  it('a built-in hold has a length and a count time', () => {
    const h = (tSeconds: number | null, durationSeconds: number): Step => ({ ...base, key: 'h', kind: 'builtInHold', tSeconds, durationSeconds });
    expect(paths(stepProblems(h(-1800, 0)))).toEqual(['durationSeconds']);
    expect(paths(stepProblems(h(-1800, 4 * 3600 + 1)))).toEqual(['durationSeconds']);
    expect(paths(stepProblems(h(null, 600)))).toEqual(['tSeconds']);
  });

  it('a personnel check says what it checks', () => {
    expect(paths(stepProblems({ ...base, key: 'c', kind: 'personnelCheck', checks: [], zone: '' }))).toEqual(['checks']);
  });

  it('blank instruction and station are refused', () => {
    expect(paths(stepProblems({ ...base, key: 'x', kind: 'action', instruction: '  ', station: '' }))).toEqual(['instruction', 'station']);
  });
});

describe('sequenceProblems', () => {
  it('accepts rising and equal times across phases, with untimed steps anywhere', () => {
    const phases = [
      phase('p1', [action('a', -7200), action('b', null), action('c', -6000)]),
      phase('p2', [action('d', null), action('e', -6000), action('f', -1800)]),
      phase('p3', [action('g', 0), action('h', null), action('i', 600)]),
    ];
    expect(sequenceProblems(phases)).toEqual([]);
  });

  it('reports a time that goes back down the list, across a phase boundary, at its field', () => {
    const phases = [phase('p1', [action('a', -3600), action('b', -1800)], 'Leak checks'), phase('p2', [action('c', null), action('d', -2400)])];
    const problems = sequenceProblems(phases);
    expect(problems).toEqual([
      { path: 'phases.1.steps.1.tSeconds', message: 'T-40:00 is earlier than T-30:00 at step 2 of Leak checks: times never go back down the list.' },
    ]);
  });

  it('compares with the latest accepted time, so one bad step gives one problem', () => {
    const problems = sequenceProblems([phase('p', [action('a', -600), action('b', -1200), action('c', -300)])]);
    expect(paths(problems)).toEqual(['phases.0.steps.1.tSeconds']);
  });

  it('reports duplicate step and phase keys and skips unreadable steps', () => {
    const problems = sequenceProblems([
      { key: 'p', name: 'One', steps: [{ key: 'a', tSeconds: -10 }, null, { key: 'a', tSeconds: -5 }] },
      { key: 'p', name: 'Two', steps: [] },
    ]);
    expect(paths(problems)).toEqual(['phases.0.steps.2.key', 'phases.1.key']);
  });
});

describe('referenceProblems and validatePhases', () => {
  it('names unknown stations and hazards with their paths', () => {
    const phases = [
      phase('p', [
        { ...base, key: 'a', kind: 'poll', station: 'TC', stations: ['PAD', 'XX'] },
        { ...base, key: 'b', kind: 'action', station: 'ZZ', hazardIds: [3, 99] },
      ]),
    ];
    const problems = referenceProblems(phases, { stations: new Set(['TC', 'PAD']), hazardIds: new Set([3]) });
    expect(paths(problems)).toEqual(['phases.0.steps.0.stations.1', 'phases.0.steps.1.station', 'phases.0.steps.1.hazardIds.1']);
  });

  it('gathers every problem at once', () => {
    const phases = [
      phase('p', [
        { ...base, key: 'a', kind: 'reading', tSeconds: -100, unit: '', min: null, max: null },
        { ...base, key: 'b', kind: 'action', tSeconds: -200 },
      ], ' '),
    ];
    expect(paths(validatePhases(phases, { stations: new Set(['TC']) }))).toEqual([
      'phases.0.name',
      'phases.0.steps.0.unit',
      'phases.0.steps.0.min',
      'phases.0.steps.1.tSeconds',
    ]);
  });
});
