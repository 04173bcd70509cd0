/**
 * The stored form of a dataset's readings: the time column and then each channel, every one `rows` float64 values,
 * little-endian, back to back in one buffer (8 bytes a value; an empty cell is NaN). Compact, and read back without
 * parsing text.
 */

export function packColumns(t: Float64Array, channels: Float64Array[]): Buffer {
  const rows = t.length;
  const out = Buffer.alloc(rows * 8 * (1 + channels.length));
  [t, ...channels].forEach((column, c) => {
    if (column.length !== rows) throw new Error('every column must have one value per row');
    for (let i = 0; i < rows; i++) out.writeDoubleLE(column[i]!, (c * rows + i) * 8);
  });
  return out;
}

export function unpackColumns(data: Buffer, rows: number, channelCount: number): { t: Float64Array; channels: Float64Array[] } {
  if (data.length !== rows * 8 * (1 + channelCount)) throw new Error(`stored sensor data has ${data.length} bytes, expected ${rows * 8 * (1 + channelCount)}`);
  const column = (c: number) => {
    const a = new Float64Array(rows);
    for (let i = 0; i < rows; i++) a[i] = data.readDoubleLE((c * rows + i) * 8);
    return a;
  };
  return { t: column(0), channels: Array.from({ length: channelCount }, (_, c) => column(c + 1)) };
}
