import { describe, expect, it } from 'vitest';
import { bucketBounds, decimateMinMax, mergeDetail, rowsAround, sliceColumns } from '../../src/domain/sensors/decimate';
import { MAX_EXCURSIONS, summarizeChannel } from '../../src/domain/sensors/summary';
import { sensorTimeline } from '../../src/domain/sensors/timeline';
import type { CountReport } from '../../src/domain/count/report';

// Min/max per bucket is the usual way to thin a line chart without losing peaks (common practice, no source).
// Every expected value below is worked by hand in the comment beside it.

describe('decimateMinMax', () => {
  it('10 rows to 4 points: two buckets of five rows, each keeping its min and max in the order they occurred', () => {
    // t = 0, 0.1 … 0.9; buckets = floor(4 / 2) = 2: rows 0-4 and rows 5-9.
    // Bucket 1: values 5,1,9,3,4 -> min 1 (row 1) before max 9 (row 2) -> [1, 9] at t 0 and 0.4 (its first and last row).
    // Bucket 2: values 2,8,0,7,6 -> max 8 (row 6) before min 0 (row 7) -> [8, 0] at t 0.5 and 0.9.
    const t = [0, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9];
    const v = [5, 1, 9, 3, 4, 2, 8, 0, 7, 6];
    // A second channel, decimated independently on the same rows: 1..10 -> [1, 5] and [6, 10].
    const w = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    expect(decimateMinMax({ t, values: [v, w] }, 4)).toEqual({
      t: [0, 0.4, 0.5, 0.9],
      values: [
        [1, 9, 8, 0],
        [1, 5, 6, 10],
      ],
      decimated: true,
    });
  });

  it('7 rows to 5 points: floor(5 / 2) = 2 buckets, rows [0, 3) and [3, 7)', () => {
    // 7 * 1 / 2 = 3.5 -> 3, so the buckets are rows 0-2 and 3-6; output 4 points (never more than asked).
    expect(bucketBounds(7, 2, 0)).toEqual([0, 3]);
    expect(bucketBounds(7, 2, 1)).toEqual([3, 7]);
    // values 3,3,3 -> [3, 3]; 1,NaN,4,2 -> min 1 (row 3), max 4 (row 5), the empty cell ignored -> [1, 4].
    const out = decimateMinMax({ t: [0, 1, 2, 3, 4, 5, 6], values: [[3, 3, 3, 1, NaN, 4, 2]] }, 5);
    expect(out.t).toEqual([0, 2, 3, 6]);
    expect(out.values).toEqual([[3, 3, 1, 4]]);
  });

  it('a bucket with no values gives two gaps; rows within maxPoints come back unchanged', () => {
    const gap = decimateMinMax({ t: [0, 1, 2, 3, 4, 5], values: [[NaN, NaN, NaN, 1, 2, 3]] }, 4);
    expect(gap.values[0]!.slice(0, 2).every(Number.isNaN)).toBe(true);
    expect(gap.values[0]!.slice(2)).toEqual([1, 3]);
    expect(decimateMinMax({ t: [0, 1], values: [[1, 2]] }, 10)).toEqual({ t: [0, 1], values: [[1, 2]], decimated: false });
  });
});

describe('rowsAround', () => {
  // t = 0, 1, 2, 3, 4, 5 (row i at i seconds).
  const t = [0, 1, 2, 3, 4, 5];
  it('the rows inside the view and one on each side', () => {
    // View 1.5..3.5 holds rows 2 and 3; with row 1 before and row 4 after -> rows [1, 5).
    expect(rowsAround(t, 1.5, 3.5)).toEqual([1, 5]);
    // View 2..3 exactly on rows: rows 2, 3 inside, plus 1 and 4 -> [1, 5).
    expect(rowsAround(t, 2, 3)).toEqual([1, 5]);
    // Past the start or the end is clipped to the data: -10..0.5 -> row 0 inside, row 1 after -> [0, 2).
    expect(rowsAround(t, -10, 0.5)).toEqual([0, 2]);
    expect(rowsAround(t, 4.5, 99)).toEqual([4, 6]);
    // Entirely before the data: only the first row, as the one "after" -> [0, 1).
    expect(rowsAround(t, -9, -8)).toEqual([0, 1]);
    expect(rowsAround(t, 3, 2)).toEqual([0, 0]);
    expect(sliceColumns({ t, values: [[10, 11, 12, 13, 14, 15]] }, [1, 5])).toEqual({ t: [1, 2, 3, 4], values: [[11, 12, 13, 14]] });
  });
});

describe('mergeDetail', () => {
  it('keeps the overview outside the zoomed stretch and the detail inside it', () => {
    // Overview at 0, 2, 4, 6, 8; detail for 3..5 is the rows 2, 3, 4, 5, 6 (one either side).
    // Overview rows before min(3, 2) = 2: t 0. After max(5, 6) = 6: t 8. -> 0 | 2 3 4 5 6 | 8.
    const overview = { t: [0, 2, 4, 6, 8], values: [[0, 20, 40, 60, 80]] };
    const detail = { t: [2, 3, 4, 5, 6], values: [[20, 30, null, 50, 60]] };
    expect(mergeDetail(overview, detail, 3, 5)).toEqual({ t: [0, 2, 3, 4, 5, 6, 8], values: [[0, 20, 30, null, 50, 60, 80]] });
  });
});

describe('summarizeChannel', () => {
  const t = [-2, -1, 0, 1, 2, 3, 4, 5];
  it('min, max and their times; excursions above and below, with the first row back as their end', () => {
    // Limits 0..10. Values: -1 (below, from -2), 5 (back at -1), 12 (above from 0), 14 (peak at 1), 10 (equal is
    // within: ends at 2), 3, 11 (above from 4), NaN (ignored) -> still open at the end (to null).
    const v = [-1, 5, 12, 14, 10, 3, 11, NaN];
    expect(summarizeChannel(2, t, v, { low: 0, high: 10 })).toEqual({
      index: 2,
      samples: 7,
      min: -1,
      tMin: -2,
      max: 14,
      tMax: 1,
      excursions: [
        { side: 'low', from: -2, to: -1, peak: -1, tPeak: -2 },
        { side: 'high', from: 0, to: 2, peak: 14, tPeak: 1 },
        { side: 'high', from: 4, to: null, peak: 11, tPeak: 4 },
      ],
      moreExcursions: 0,
    });
  });

  it('a jump straight from below to above ends one excursion and starts the other at the same row', () => {
    expect(summarizeChannel(0, [0, 1, 2], [-5, 20, 5], { low: 0, high: 10 }).excursions).toEqual([
      { side: 'low', from: 0, to: 1, peak: -5, tPeak: 0 },
      { side: 'high', from: 1, to: 2, peak: 20, tPeak: 1 },
    ]);
  });

  it('no limits, no excursions; an all-empty channel has no min or max; more than 20 excursions are counted, not listed', () => {
    expect(summarizeChannel(0, [0, 1], [3, 4], { low: null, high: null })).toMatchObject({ min: 3, max: 4, excursions: [] });
    expect(summarizeChannel(0, [0, 1], [NaN, NaN], { low: null, high: 1 })).toMatchObject({ samples: 0, min: null, tMin: null, max: null, tMax: null });
    // 25 spikes above 1: 0,2,0,2,... -> 25 excursions, 20 listed and 5 more.
    const n = 50;
    const s = summarizeChannel(0, Array.from({ length: n }, (_, i) => i), Array.from({ length: n }, (_, i) => (i % 2 ? 2 : 0)), { low: null, high: 1 });
    expect(s.excursions).toHaveLength(MAX_EXCURSIONS);
    expect(s.moreExcursions).toBe(5);
  });
});

describe('sensorTimeline', () => {
  const base = {
    holds: {
      count: 1,
      totalSeconds: 90,
      byCategory: {},
      list: [{ holdId: 'h1', category: 'weather', reason: 'Gusts', source: 'manual', calledBy: null, calledByStation: 'TC', calledAt: 1_000_000, calledAtT: -120, clearedAt: 1_060_000, seconds: 90 }],
    },
    redlines: [{ stepKey: 's1', station: 'PROP', instruction: 'LOX tank pressure', value: 15, unit: 'bar', message: 'Above 14 bar', at: 1_150_000, t: -30 }],
  } as unknown as Pick<CountReport, 'holds' | 'redlines'>;

  it('places holds and redlines in wall-clock seconds from the actual T-0', () => {
    // T-0 at 1 180 000 ms: the hold called at 1 000 000 is 180 s before it and lasts 90 s -> -180 .. -90;
    // the reading at 1 150 000 is 30 s before T-0 -> -30.
    const tl = sensorTimeline({ ...base, actualT0At: 1_180_000 });
    expect(tl.holds).toEqual([{ holdId: 'h1', category: 'weather', reason: 'Gusts', fromT: -180, toT: -90 }]);
    expect(tl.redlines[0]).toMatchObject({ t: -30, value: 15, unit: 'bar' });
    expect(tl).toMatchObject({ t0At: 1_180_000, unplacedHolds: 0 });
  });

  it('without T-0, holds cannot be placed and redlines keep the count clock’s T', () => {
    const tl = sensorTimeline({ ...base, actualT0At: null });
    expect(tl).toMatchObject({ t0At: null, holds: [], unplacedHolds: 1 });
    expect(tl.redlines[0]!.t).toBe(-30);
  });
});
