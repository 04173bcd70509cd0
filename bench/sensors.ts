/**
 * Sensor data: how long the server takes to read a 100,000-row CSV, and to answer the plot's thinned columns and the
 * table's summaries from the stored columns. `npx tsx bench/sensors.ts`; not part of any test. No network, no disk.
 */
import { performance } from 'node:perf_hooks';
import { unpackColumns, packColumns } from '../server/sensors/columns';
import { parseSensorCsv } from '../server/sensors/parse';
import { decimateMinMax } from '../src/domain/sensors/decimate';
import { summarizeChannel } from '../src/domain/sensors/summary';

const ROWS = 100_000;
const CHANNELS = 4;

function csv(): Buffer {
  const lines = [`t_s,${Array.from({ length: CHANNELS }, (_, c) => `ch${c} (bar)`).join(',')}`];
  for (let i = 0; i < ROWS; i++) {
    const t = (i - 60_000) / 100;
    lines.push(`${t.toFixed(2)},${Array.from({ length: CHANNELS }, (_, c) => (10 + 5 * Math.sin(t / (c + 1))).toFixed(3)).join(',')}`);
  }
  return Buffer.from(lines.join('\n') + '\n');
}

async function time<T>(label: string, runs: number, fn: () => Promise<T> | T): Promise<T> {
  let result: T | undefined;
  const ms: number[] = [];
  for (let r = 0; r < runs; r++) {
    const start = performance.now();
    result = await fn();
    ms.push(performance.now() - start);
  }
  ms.sort((a, b) => a - b);
  console.log(`${label.padEnd(44)} median ${ms[Math.floor(ms.length / 2)]!.toFixed(1)} ms, best ${ms[0]!.toFixed(1)} ms (${runs} runs)`);
  return result!;
}

const bytes = csv();
console.log(`${ROWS.toLocaleString('en-GB')} rows x ${CHANNELS} channels, ${(bytes.length / 1e6).toFixed(1)} MB of CSV`);
const parsed = await time('parse the CSV', 5, () => parseSensorCsv(bytes, { t0At: null }));
const packed = await time('pack the columns', 5, () => packColumns(parsed.t, parsed.channels.map((c) => c.values)));
const cols = await time('unpack the columns', 10, () => unpackColumns(packed, ROWS, CHANNELS));
await time('decimate to 4,000 points', 10, () => decimateMinMax({ t: cols.t, values: cols.channels }, 4000));
await time('summaries with limits, every row', 10, () => cols.channels.map((v, i) => summarizeChannel(i, cols.t, v, { low: 6, high: 14 })));
