import { describe, expect, it } from 'vitest';
import { diffRevisions } from '../../src/domain/procedures/diff';
import type { Phase, Step } from '../../src/domain/procedures/steps';

// Holdfire's diff rules: steps matched by key; moved = changed phase, or out of order among the kept steps.
const s = (key: string, extra: Partial<Step> = {}): Step =>
  ({ key, kind: 'action', tSeconds: null, station: 'TC', instruction: `Step ${key}.`, hazardIds: [], propellants: [], note: '', ...extra }) as Step;
const p = (key: string, steps: Step[], name = key): Phase => ({ key, name, steps });

describe('diffRevisions', () => {
  it('finds nothing between a revision and itself', () => {
    const rev = [p('a', [s('1'), s('2')]), p('b', [s('3')])];
    const d = diffRevisions(rev, rev);
    expect(d).toMatchObject({ added: [], removed: [], changed: [], moved: [], unchanged: 3 });
  });

  it('reports added and removed steps with their places; a shifted step is not moved', () => {
    const d = diffRevisions([p('a', [s('1'), s('2'), s('3')])], [p('a', [s('0'), s('1'), s('3')])]);
    expect(d.added.map((x) => [x.key, x.at.index])).toEqual([['0', 0]]);
    expect(d.removed.map((x) => [x.key, x.at.index])).toEqual([['2', 1]]);
    expect(d.moved).toEqual([]);
    expect(d.unchanged).toBe(2);
  });

  it('names the changed fields with before and after', () => {
    const d = diffRevisions(
      [p('a', [s('1', { tSeconds: -600, instruction: 'Open the vent.' })])],
      [p('a', [s('1', { tSeconds: -540, instruction: 'Open the LOX vent.', hazardIds: [3] })])],
    );
    expect(d.changed).toEqual([
      {
        key: '1',
        at: { phaseKey: 'a', phaseName: 'a', index: 0 },
        fields: ['hazardIds', 'instruction', 'tSeconds'],
        before: { hazardIds: [], instruction: 'Open the vent.', tSeconds: -600 },
        after: { hazardIds: [3], instruction: 'Open the LOX vent.', tSeconds: -540 },
      },
    ]);
  });

  it('a change of kind lists the kind and the fields that came and went', () => {
    const d = diffRevisions([p('a', [s('1')])], [p('a', [s('1', { kind: 'reading', unit: 'bar', min: 1, max: 2 } as Partial<Step>)])]);
    expect(d.changed[0]!.fields).toEqual(['kind', 'max', 'min', 'unit']);
  });

  it('finds the one step dragged to a new place, not the ones it jumped over', () => {
    const d = diffRevisions([p('a', [s('1'), s('2'), s('3'), s('4'), s('5')])], [p('a', [s('1'), s('5'), s('2'), s('3'), s('4')])]);
    expect(d.moved.map((m) => [m.key, m.from.index, m.to.index])).toEqual([['5', 4, 1]]);
    expect(d.unchanged).toBe(4);
  });

  it('a step moved into another phase is moved, even at the same overall position', () => {
    const d = diffRevisions([p('a', [s('1'), s('2')]), p('b', [s('3')])], [p('a', [s('1')]), p('b', [s('2'), s('3')])]);
    expect(d.moved).toMatchObject([{ key: '2', from: { phaseKey: 'a', index: 1 }, to: { phaseKey: 'b', index: 0 } }]);
  });

  it('reports phases added, removed, renamed and reordered', () => {
    const d = diffRevisions(
      [p('a', [], 'Pad set-up'), p('b', [], 'Leak check'), p('c', [], 'Old')],
      [p('b', [], 'Leak checks'), p('a', [], 'Pad set-up'), p('n', [], 'New')],
    );
    expect(d.phases.added).toEqual([{ key: 'n', name: 'New' }]);
    expect(d.phases.removed).toEqual([{ key: 'c', name: 'Old' }]);
    expect(d.phases.renamed).toEqual([{ key: 'b', from: 'Leak check', to: 'Leak checks' }]);
    expect(d.phases.moved).toHaveLength(1);
  });
});
