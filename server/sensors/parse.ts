/**
 * Reading a sensor CSV: a header row, one time column and up to SENSOR_MAX_CHANNELS channel columns of numbers.
 * Every refusal is an HttpError whose message names the row (the file's line number, the header being row 1)
 * and the column, so a person can find the cell. Nothing here touches the database or the disk.
 */
import { Readable } from 'node:stream';
import { CsvError, parse } from 'csv-parse';
import { SENSOR_MAX_CHANNELS, SENSOR_MAX_ROWS, type SensorTimeBase } from '../../src/contract/sensors';
import { HttpError } from '../http/errors';

export interface ParsedChannel {
  name: string;
  unit: string;
  values: Float64Array;
}

export interface ParsedSensorFile {
  timeColumn: string;
  timeBase: SensorTimeBase;
  /** Seconds from T-0. */
  t: Float64Array;
  channels: ParsedChannel[];
}

export interface ParseOptions {
  /** Epoch ms of the count's actual T-0, or null when it never reached T-0 (wall-clock times are then refused). */
  t0At: number | null;
  maxRows?: number;
  maxChannels?: number;
}

const TIME_NAMES = new Set(['t', 'time', 't_s', 'time_s', 't_sec', 'time_sec', 'timestamp', 'datetime', 'date_time', 'utc', 'time_utc', 'elapsed']);
const SECOND_UNITS: Record<string, number> = { s: 1, sec: 1, secs: 1, second: 1, seconds: 1, ms: 0.001 };
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
// A date and a time with seconds and a zone: 2026-05-17T14:30:05.250Z, 2026-05-17 14:30:05+02:00.
const ISO = /^(\d{4}-\d{2}-\d{2})[T ](\d{2}:\d{2}:\d{2})(?:[.,](\d{1,9}))?(Z|[+-]\d{2}:?\d{2})$/i;

const fileError = (status: number, code: string, message: string, path = 'file') => new HttpError(status, code, message, [{ path, message }]);

/** "chamber_pressure (bar)" -> name and unit; "[bar]" works too; no brackets -> no unit. */
export function splitHeader(raw: string): { name: string; unit: string } {
  const m = /^(.*?)\s*[([]\s*([^)\]]*?)\s*[)\]]\s*$/.exec(raw.trim());
  if (m && m[1]) return { name: m[1].trim(), unit: m[2]! };
  return { name: raw.trim(), unit: '' };
}

function isTimeName(name: string): boolean {
  return TIME_NAMES.has(name.toLowerCase().replace(/[\s-]+/g, '_'));
}

/** Epoch ms of an ISO 8601 date-time with a zone, keeping milliseconds; NaN when it is not one. */
export function parseIsoMs(text: string): number {
  const m = ISO.exec(text);
  if (!m) return NaN;
  const zone = m[4]!.toUpperCase() === 'Z' ? 'Z' : m[4]!.length === 5 ? `${m[4]!.slice(0, 3)}:${m[4]!.slice(3)}` : m[4]!;
  const whole = Date.parse(`${m[1]}T${m[2]}${zone}`);
  if (Number.isNaN(whole)) return NaN;
  return whole + (m[3] ? Number(`0.${m[3]}`) * 1000 : 0);
}

function quoteCell(text: string): string {
  return `“${text.length > 40 ? `${text.slice(0, 40)}…` : text}”`;
}

export async function parseSensorCsv(bytes: Uint8Array, options: ParseOptions): Promise<ParsedSensorFile> {
  const maxRows = options.maxRows ?? SENSOR_MAX_ROWS;
  const maxChannels = options.maxChannels ?? SENSOR_MAX_CHANNELS;
  const parser = parse({
    bom: true,
    relax_column_count: true,
    trim: true,
    skip_empty_lines: true,
    comment: '#',
    comment_no_infix: true,
    info: true,
    max_record_size: 64 * 1024,
  });

  // Fed in slices, and the loop below pauses every few thousand rows, so a large file does not hold the server up.
  Readable.from(slices(bytes)).pipe(parser);

  let header: { name: string; unit: string; raw: string }[] | null = null;
  let timeIndex = -1;
  let timeBase: SensorTimeBase | null = null;
  let timeScale = 1;
  const t: number[] = [];
  let columns: number[][] = [];
  const where = (line: number, col: number) => `Row ${line}, column ${col + 1} (${quoteCell(header![col]!.raw)})`;

  try {
    for await (const { record, info } of parser as AsyncIterable<{ record: string[]; info: { lines: number } }>) {
      const line = info.lines;
      if (!header) {
        if (record.length > maxChannels + 1) {
          throw fileError(400, 'sensor_too_many_columns', `Row ${line} (the header) has ${record.length} columns; a file may have a time column and at most ${maxChannels} channels. Split it into several files.`);
        }
        header = record.map((raw) => ({ ...splitHeader(raw), raw }));
        header.forEach((h, i) => {
          if (!h.name) throw fileError(400, 'sensor_bad_header', `Row ${line} (the header), column ${i + 1} has no name. Name every column.`);
        });
        timeIndex = header.findIndex((h) => isTimeName(h.name));
        if (timeIndex < 0) {
          throw fileError(
            400,
            'sensor_no_time_column',
            `Row ${line} (the header) has no time column. Name one column t_s (or "T (s)") for seconds from T-0, or timestamp for ISO 8601 date-times.`,
          );
        }
        const timeUnit = header[timeIndex]!.unit.toLowerCase();
        if (timeUnit && SECOND_UNITS[timeUnit] === undefined) {
          throw fileError(400, 'sensor_bad_time_unit', `${where(line, timeIndex)}: the time unit ${quoteCell(header[timeIndex]!.unit)} is not one Holdfire reads. Use s or ms.`);
        }
        timeScale = SECOND_UNITS[timeUnit] ?? 1;
        if (record.length < 2) throw fileError(400, 'sensor_no_channels', `Row ${line} (the header) has a time column and no channel. Add at least one column of readings.`);
        const seen = new Map<string, number>();
        header.forEach((h, i) => {
          const key = h.name.toLowerCase();
          if (seen.has(key)) throw fileError(400, 'sensor_duplicate_channel', `Row ${line} (the header): columns ${seen.get(key)! + 1} and ${i + 1} are both named ${quoteCell(h.name)}. Give each column its own name.`);
          seen.set(key, i);
        });
        columns = header.map(() => []);
        continue;
      }
      if (t.length >= maxRows) {
        throw fileError(413, 'sensor_too_many_rows', `The file has more than ${maxRows.toLocaleString('en-GB')} data rows (row ${line} is one too many). Split it into several files, or keep fewer rows per second.`);
      }
      if (record.length !== header.length) {
        throw fileError(400, 'sensor_bad_row', `Row ${line} has ${record.length} cells; the header has ${header.length}. Every row needs one cell per column (leave a cell empty for no reading).`);
      }
      const timeText = record[timeIndex]!;
      if (timeText === '') throw fileError(400, 'sensor_bad_time', `${where(line, timeIndex)} is empty. Every row needs a time.`);
      if (timeBase === null) {
        if (NUMBER.test(timeText)) timeBase = 'seconds';
        else if (!Number.isNaN(parseIsoMs(timeText))) {
          timeBase = 'wallclock';
          if (options.t0At === null) {
            throw fileError(
              409,
              'sensor_no_t0',
              `${where(line, timeIndex)} is a wall-clock time, but this count never reached T-0, so the times cannot be placed on its timeline. Give times as seconds from T-0 (a column t_s) instead.`,
            );
          }
        } else {
          throw fileError(400, 'sensor_bad_time', `${where(line, timeIndex)}: ${quoteCell(timeText)} is neither seconds (like -12.5) nor an ISO 8601 date-time with a zone (like 2026-05-17T14:30:05.250Z).`);
        }
      }
      let seconds: number;
      if (timeBase === 'seconds') {
        if (!NUMBER.test(timeText)) throw fileError(400, 'sensor_bad_time', `${where(line, timeIndex)}: ${quoteCell(timeText)} is not a number of seconds, like the rows above it.`);
        seconds = Number(timeText) * timeScale;
      } else {
        const ms = parseIsoMs(timeText);
        if (Number.isNaN(ms)) throw fileError(400, 'sensor_bad_time', `${where(line, timeIndex)}: ${quoteCell(timeText)} is not an ISO 8601 date-time with a zone, like the rows above it.`);
        seconds = (ms - options.t0At!) / 1000;
      }
      const previous = t.at(-1);
      if (previous !== undefined && !(seconds > previous)) {
        throw fileError(400, 'sensor_time_not_increasing', `${where(line, timeIndex)}: the time ${quoteCell(timeText)} is not after the row above. Times must increase from row to row.`);
      }
      t.push(seconds);
      // Let other requests in now and then: a large file takes about a second to read (bench/sensors.ts).
      if (t.length % 5000 === 0) await new Promise((resolve) => setImmediate(resolve));
      for (let c = 0; c < record.length; c++) {
        if (c === timeIndex) continue;
        const cell = record[c]!;
        if (cell === '') columns[c]!.push(NaN);
        else if (NUMBER.test(cell)) columns[c]!.push(Number(cell));
        else throw fileError(400, 'sensor_not_a_number', `${where(line, c)}: ${quoteCell(cell)} is not a number. Use a point for decimals (12.5) and leave a cell empty for no reading.`);
      }
    }
  } catch (error) {
    parser.destroy();
    if (error instanceof HttpError) throw error;
    if (error instanceof CsvError) throw csvError(error);
    throw error;
  }
  if (!header) throw fileError(400, 'sensor_file_empty', 'The file has no rows. Upload a CSV with a header row and rows of readings.');
  if (t.length === 0) throw fileError(400, 'sensor_no_rows', 'The file has a header and no data rows.');
  return {
    timeColumn: header[timeIndex]!.raw,
    timeBase: timeBase!,
    t: Float64Array.from(t),
    channels: header.flatMap((h, i) => (i === timeIndex ? [] : [{ name: h.name, unit: h.unit, values: Float64Array.from(columns[i]!) }])),
  };
}

function* slices(bytes: Uint8Array, size = 64 * 1024) {
  for (let i = 0; i < bytes.length; i += size) yield Buffer.from(bytes.buffer, bytes.byteOffset + i, Math.min(size, bytes.length - i));
}

function csvError(error: CsvError): HttpError {
  const line = (error as CsvError & { lines?: number }).lines ?? '?';
  switch (error.code) {
    case 'CSV_QUOTE_NOT_CLOSED':
      return fileError(400, 'sensor_bad_csv', `A quoted cell that starts near row ${line} is never closed. Check the quotation marks.`);
    case 'CSV_MAX_RECORD_SIZE':
      return fileError(400, 'sensor_bad_csv', `Row ${line} is too long to be a row of readings.`);
    default:
      return fileError(400, 'sensor_bad_csv', `Row ${line} cannot be read as CSV: ${error.message.replace(/^Invalid[^:]*:\s*/, '')}`);
  }
}
