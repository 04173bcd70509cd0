/**
 * What a channel did, in words a table can hold: its minimum and maximum with their times, and every stretch it
 * spent beyond a limit. This is the text equivalent of the plot, computed from every stored row. Pure.
 */

export interface ChannelLimits {
  low: number | null;
  high: number | null;
}

export interface Excursion {
  side: 'low' | 'high';
  /** Time (s from T-0) of the first row beyond the limit. */
  from: number;
  /** Time of the first row back within the limit; null when the data ends beyond it. */
  to: number | null;
  /** The furthest value beyond the limit, and its time. */
  peak: number;
  tPeak: number;
}

export interface ChannelSummary {
  index: number;
  /** Rows with a value (empty cells are not counted). */
  samples: number;
  min: number | null;
  tMin: number | null;
  max: number | null;
  tMax: number | null;
  excursions: Excursion[];
  /** Excursions beyond the first MAX_EXCURSIONS that are not listed. */
  moreExcursions: number;
}

export const MAX_EXCURSIONS = 20;

/**
 * A value is beyond a limit when it is strictly above the high limit or strictly below the low one; a value equal
 * to a limit is within it. Empty cells (NaN) neither start nor end an excursion.
 */
export function summarizeChannel(index: number, t: ArrayLike<number>, v: ArrayLike<number>, limits: ChannelLimits): ChannelSummary {
  let samples = 0;
  let iMin = -1;
  let iMax = -1;
  const excursions: Excursion[] = [];
  let total = 0;
  let open: Excursion | null = null;
  const close = (to: number | null) => {
    if (open) {
      total++;
      if (excursions.length < MAX_EXCURSIONS) excursions.push({ ...open, to });
      open = null;
    }
  };
  for (let i = 0; i < t.length; i++) {
    const x = v[i]!;
    if (Number.isNaN(x)) continue;
    samples++;
    if (iMin < 0 || x < v[iMin]!) iMin = i;
    if (iMax < 0 || x > v[iMax]!) iMax = i;
    const side: 'low' | 'high' | null = limits.high !== null && x > limits.high ? 'high' : limits.low !== null && x < limits.low ? 'low' : null;
    if (open && open.side !== side) close(t[i]!);
    if (side && !open) open = { side, from: t[i]!, to: null, peak: x, tPeak: t[i]! };
    else if (side && open && (side === 'high' ? x > open.peak : x < open.peak)) {
      open.peak = x;
      open.tPeak = t[i]!;
    }
  }
  close(null);
  return {
    index,
    samples,
    min: iMin < 0 ? null : v[iMin]!,
    tMin: iMin < 0 ? null : t[iMin]!,
    max: iMax < 0 ? null : v[iMax]!,
    tMax: iMax < 0 ? null : t[iMax]!,
    excursions,
    moreExcursions: total - excursions.length,
  };
}
