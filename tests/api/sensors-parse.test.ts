import { describe, expect, it } from 'vitest';
import { HttpError } from '../../server/http/errors';
import { packColumns, unpackColumns } from '../../server/sensors/columns';
import { parseIsoMs, parseSensorCsv, splitHeader } from '../../server/sensors/parse';

const T0 = Date.parse('2026-05-17T14:30:00Z');
const bytes = (text: string) => new TextEncoder().encode(text);
const parse = (text: string, t0At: number | null = T0, more = {}) => parseSensorCsv(bytes(text), { t0At, ...more });

async function refusal(text: string, t0At: number | null = T0, more = {}): Promise<HttpError> {
  try {
    await parse(text, t0At, more);
  } catch (error) {
    if (error instanceof HttpError) return error;
    throw error;
  }
  throw new Error('the file was accepted');
}

describe('reading a sensor CSV', () => {
  it('seconds from T-0, units in round or square brackets, empty cells as gaps, comments and a BOM skipped', async () => {
    const r = await parse('\uFEFF# recorder 3, invented\nT (s),chamber_pressure (bar),thrust [kN],valve_state\n-1.5,0.5,,0\n0,1e1,2,1\n.25,3,4,1\n');
    expect(r.timeBase).toBe('seconds');
    expect(r.timeColumn).toBe('T (s)');
    expect(Array.from(r.t)).toEqual([-1.5, 0, 0.25]);
    expect(r.channels.map((c) => [c.name, c.unit])).toEqual([
      ['chamber_pressure', 'bar'],
      ['thrust', 'kN'],
      ['valve_state', ''],
    ]);
    expect(Array.from(r.channels[0]!.values)).toEqual([0.5, 10, 3]);
    expect(Number.isNaN(r.channels[1]!.values[0])).toBe(true);
  });

  it('milliseconds are converted; the time column may stand anywhere', async () => {
    const r = await parse('p (bar),time (ms)\n1,-500\n2,250\n');
    expect(Array.from(r.t)).toEqual([-0.5, 0.25]);
    expect(r.channels.map((c) => c.name)).toEqual(['p']);
  });

  it('wall-clock ISO 8601 with a zone becomes seconds from T-0, keeping milliseconds', async () => {
    // 14:29:55.250Z is 4.75 s before 14:30:00Z; 16:30:01+02:00 is 14:30:01Z, 1 s after; the space form is accepted.
    const r = await parse('timestamp,p (bar)\n2026-05-17T14:29:55.250Z,1\n2026-05-17 16:30:01+02:00,2\n2026-05-17T14:30:01.5+0000,3\n');
    expect(r.timeBase).toBe('wallclock');
    expect(Array.from(r.t)).toEqual([-4.75, 1, 1.5]);
    // RFC 3339 / ISO 8601 offsets: +02:00 means two hours ahead of UTC.
    expect(parseIsoMs('2026-05-17T16:30:00+02:00')).toBe(T0);
    expect(parseIsoMs('2026-05-17T14:30:00.123456Z')).toBeCloseTo(T0 + 123.456, 6);
    expect(parseIsoMs('2026-05-17T14:30:00')).toBeNaN(); // no zone: ambiguous, refused
  });

  it('splits headers', () => {
    expect(splitHeader(' lox_tank_pressure ( bar ) ')).toEqual({ name: 'lox_tank_pressure', unit: 'bar' });
    expect(splitHeader('(bar)')).toEqual({ name: '(bar)', unit: '' });
  });
});

describe('refusals name the row and the column', () => {
  it('every kind', async () => {
    const cases: [string, number, string, string][] = [
      ['', 400, 'sensor_file_empty', 'The file has no rows.'],
      ['# only a comment\n', 400, 'sensor_file_empty', 'The file has no rows.'],
      ['t_s,p\n', 400, 'sensor_no_rows', 'The file has a header and no data rows.'],
      ['p,q\n1,2\n', 400, 'sensor_no_time_column', 'Row 1 (the header) has no time column.'],
      ['t_s\n1\n', 400, 'sensor_no_channels', 'Row 1 (the header) has a time column and no channel.'],
      ['t_s,p,\n1,2,3\n', 400, 'sensor_bad_header', 'Row 1 (the header), column 3 has no name.'],
      ['t_s,p,P\n1,2,3\n', 400, 'sensor_duplicate_channel', 'Row 1 (the header): columns 2 and 3 are both named “P”.'],
      ['t (min),p\n1,2\n', 400, 'sensor_bad_time_unit', 'Row 1, column 1 (“t (min)”): the time unit “min” is not one Holdfire reads.'],
      ['t_s,p\n0,1\n0.1,1.2.3\n', 400, 'sensor_not_a_number', 'Row 3, column 2 (“p”): “1.2.3” is not a number.'],
      ['t_s,p\n0,1\n,2\n', 400, 'sensor_bad_time', 'Row 3, column 1 (“t_s”) is empty.'],
      ['t_s,p\nsoon,1\n', 400, 'sensor_bad_time', 'Row 2, column 1 (“t_s”): “soon” is neither seconds'],
      ['t_s,p\n0,1\n2026-05-17T14:30:00Z,2\n', 400, 'sensor_bad_time', 'Row 3, column 1 (“t_s”): “2026-05-17T14:30:00Z” is not a number of seconds'],
      ['t_s,p\n0,1\n1,2\n1,3\n', 400, 'sensor_time_not_increasing', 'Row 4, column 1 (“t_s”): the time “1” is not after the row above.'],
      ['t_s,p\n0,1\n1\n', 400, 'sensor_bad_row', 'Row 3 has 1 cells; the header has 2.'],
      ['t_s,p\n0,"1\n', 400, 'sensor_bad_csv', 'A quoted cell that starts near row 2 is never closed.'],
      ['t_s,a,b,c\n0,1,2,3\n', 400, 'sensor_too_many_columns', 'Row 1 (the header) has 4 columns; a file may have a time column and at most 2 channels.'],
      ['t_s,a\n0,1\n1,1\n2,1\n3,1\n', 413, 'sensor_too_many_rows', 'The file has more than 3 data rows (row 5 is one too many).'],
    ];
    for (const [text, status, code, start] of cases) {
      const e = await refusal(text, T0, { maxChannels: 2, maxRows: 3 });
      expect([e.status, e.code], text).toEqual([status, code]);
      expect(e.message.startsWith(start), `${e.message} should start with ${start}`).toBe(true);
    }
  });

  it('wall-clock times on a count without T-0 are refused with a way out', async () => {
    const e = await refusal('timestamp,p\n2026-05-17T14:30:00Z,1\n', null);
    expect([e.status, e.code]).toEqual([409, 'sensor_no_t0']);
    expect(e.message).toContain('never reached T-0');
    expect(e.message).toContain('seconds from T-0 (a column t_s)');
  });
});

describe('packed columns', () => {
  it('round-trip exactly, gaps included, 8 bytes a value', () => {
    const t = Float64Array.from([-1, 0.1, 0.2]);
    const a = Float64Array.from([1.5, NaN, -3e-7]);
    const packed = packColumns(t, [a]);
    expect(packed.length).toBe(2 * 3 * 8);
    const back = unpackColumns(packed, 3, 1);
    expect(Array.from(back.t)).toEqual([-1, 0.1, 0.2]);
    expect(Array.from(back.channels[0]!)).toEqual([1.5, NaN, -3e-7]);
    expect(() => unpackColumns(packed, 4, 1)).toThrow();
  });
});
