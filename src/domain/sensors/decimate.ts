/**
 * Min/max decimation for plotting: many rows become at most `maxPoints` rows that still show every peak and
 * trough. The rows are cut into `floor(maxPoints / 2)` buckets of consecutive rows (as equal in size as whole
 * rows allow); each bucket gives two rows, at its first and its last time, and each channel's two values there
 * are that bucket's minimum and maximum, in the order they occurred. A plot drawn a bucket per pixel column
 * looks the same as the full data (the common "min/max per pixel" practice for line charts; common practice,
 * no source). Pure: arrays in, arrays out. Empty cells are NaN and are ignored inside a bucket.
 */

export interface Columns {
  t: ArrayLike<number>;
  values: ArrayLike<number>[];
}

export interface DecimatedColumns {
  t: number[];
  values: number[][];
  decimated: boolean;
}

/** Bucket `b` of `buckets` over `n` rows: [start, end). */
export function bucketBounds(n: number, buckets: number, b: number): [number, number] {
  return [Math.floor((b * n) / buckets), Math.floor(((b + 1) * n) / buckets)];
}

export function decimateMinMax(columns: Columns, maxPoints: number): DecimatedColumns {
  const n = columns.t.length;
  if (n <= maxPoints || maxPoints < 2) {
    return { t: Array.from(columns.t), values: columns.values.map((v) => Array.from(v)), decimated: false };
  }
  const buckets = Math.floor(maxPoints / 2);
  const t: number[] = new Array(buckets * 2);
  const values: number[][] = columns.values.map(() => new Array(buckets * 2));
  for (let b = 0; b < buckets; b++) {
    const [start, end] = bucketBounds(n, buckets, b);
    t[2 * b] = columns.t[start]!;
    t[2 * b + 1] = columns.t[end - 1]!;
    columns.values.forEach((v, c) => {
      let iMin = -1;
      let iMax = -1;
      for (let i = start; i < end; i++) {
        const x = v[i]!;
        if (Number.isNaN(x)) continue;
        if (iMin < 0 || x < v[iMin]!) iMin = i;
        if (iMax < 0 || x > v[iMax]!) iMax = i;
      }
      const out = values[c]!;
      if (iMin < 0) {
        out[2 * b] = NaN;
        out[2 * b + 1] = NaN;
      } else {
        const [first, second] = iMin <= iMax ? [iMin, iMax] : [iMax, iMin];
        out[2 * b] = v[first]!;
        out[2 * b + 1] = v[second]!;
      }
    });
  }
  return { t, values, decimated: true };
}

/**
 * The rows to send for a view from `from` to `to` seconds: every row inside it plus one on each side, so the lines
 * run to the edges of the view. Times must increase. Returns [start, end), empty when nothing is near the view.
 */
export function rowsAround(t: ArrayLike<number>, from: number, to: number): [number, number] {
  const firstAtOrAfter = (x: number) => {
    let lo = 0;
    let hi = t.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (t[mid]! < x) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  const firstAfter = (x: number) => {
    let lo = 0;
    let hi = t.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (t[mid]! <= x) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  if (to < from) return [0, 0];
  const start = Math.max(0, firstAtOrAfter(from) - 1);
  const end = Math.min(t.length, firstAfter(to) + 1);
  return start < end ? [start, end] : [0, 0];
}

/** Columns restricted to rows [start, end). */
export function sliceColumns(columns: Columns, [start, end]: [number, number]): Columns {
  const cut = (a: ArrayLike<number>) => Array.prototype.slice.call(a, start, end) as number[];
  return { t: cut(columns.t), values: columns.values.map(cut) };
}

export interface PlotColumns {
  t: number[];
  values: (number | null)[][];
}

/**
 * The overview with a stretch replaced by its detail: overview rows before `from`, every detail row, overview rows
 * after `to`. Times stay increasing as long as the detail lies within [from, to] plus one row either side.
 */
export function mergeDetail(overview: PlotColumns, detail: PlotColumns, from: number, to: number): PlotColumns {
  const first = detail.t[0] ?? from;
  const last = detail.t[detail.t.length - 1] ?? to;
  const before: number[] = [];
  const after: number[] = [];
  overview.t.forEach((x, i) => {
    if (x < Math.min(from, first)) before.push(i);
    else if (x > Math.max(to, last)) after.push(i);
  });
  const pick = (column: (number | null)[], rows: number[]) => rows.map((i) => column[i]!);
  return {
    t: [...pick(overview.t, before), ...detail.t, ...pick(overview.t, after)] as number[],
    values: overview.values.map((column, c) => [...pick(column, before), ...detail.values[c]!, ...pick(column, after)]),
  };
}
