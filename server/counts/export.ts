/**
 * A count's log as a file, and back: JSON Lines (one event a line, the canonical JSON of every hashed field plus
 * `prevHash` and `hash`) or CSV (one row an event, the payload as JSON text in its cell). Either export holds
 * everything the hash chain covers, so `npm run verify-log -- FILE` can recompute the chain with no server.
 */
import { parse } from 'csv-parse/sync';
import { stringify } from 'csv-stringify/sync';
import { canonicalJson, type ChainedEvent } from '../../src/domain/count/chain';

export type ExportFormat = 'jsonl' | 'csv';

export const CSV_COLUMNS = ['seq', 'countId', 'type', 'at', 'atIso', 'actorUserId', 'actorName', 'station', 'payload', 'prevHash', 'hash'] as const;

/** One line per event, in seq order; each line is canonical JSON, so an unchanged export is byte-for-byte stable. */
export function toJsonl(events: readonly ChainedEvent[]): string {
  return events
    .map((e) => canonicalJson({ seq: e.seq, countId: e.countId, type: e.type, at: e.at, actor: e.actor, station: e.station, payload: e.payload, prevHash: e.prevHash, hash: e.hash }) + '\n')
    .join('');
}

/** A header row, then one row per event. `atIso` is for people; `at` (epoch ms) is what the hash covers. */
export function toCsv(events: readonly ChainedEvent[]): string {
  return stringify(
    events.map((e) => [
      e.seq,
      e.countId,
      e.type,
      e.at,
      new Date(e.at).toISOString(),
      e.actor?.userId ?? '',
      e.actor?.name ?? '',
      e.station ?? '',
      canonicalJson(e.payload),
      e.prevHash,
      e.hash,
    ]),
    { header: true, columns: [...CSV_COLUMNS] },
  );
}

export class ExportFileError extends Error {
  constructor(
    message: string,
    readonly line: number | null,
  ) {
    super(line === null ? message : `line ${line}: ${message}`);
  }
}

const HEX64 = /^[0-9a-f]{64}$/;

function integer(value: unknown, what: string, line: number): number {
  const n = typeof value === 'number' ? value : typeof value === 'string' && /^-?\d+$/.test(value.trim()) ? Number(value) : NaN;
  if (!Number.isSafeInteger(n)) throw new ExportFileError(`${what} is not a whole number`, line);
  return n;
}

function text(value: unknown, what: string, line: number): string {
  if (typeof value !== 'string') throw new ExportFileError(`${what} is not text`, line);
  return value;
}

function hash(value: unknown, what: string, line: number): string {
  const s = text(value, what, line);
  if (!HEX64.test(s)) throw new ExportFileError(`${what} is not 64 lowercase hex digits`, line);
  return s;
}

/** Reads an export made by toJsonl. Blank lines are allowed; anything else that is not an event is an error. */
export function parseJsonl(content: string): ChainedEvent[] {
  const events: ChainedEvent[] = [];
  content.split('\n').forEach((raw, i) => {
    const line = i + 1;
    if (raw.trim() === '') return;
    let o: Record<string, unknown>;
    try {
      o = JSON.parse(raw) as Record<string, unknown>;
    } catch {
      throw new ExportFileError('not JSON', line);
    }
    if (typeof o !== 'object' || o === null || Array.isArray(o)) throw new ExportFileError('not an event object', line);
    const actor = o.actor as { userId?: unknown; name?: unknown } | null | undefined;
    if (actor !== null && (typeof actor !== 'object' || actor === undefined)) throw new ExportFileError('actor is neither an object nor null', line);
    events.push({
      seq: integer(o.seq, 'seq', line),
      countId: integer(o.countId, 'countId', line),
      type: text(o.type, 'type', line),
      at: integer(o.at, 'at', line),
      actor: actor === null ? null : { userId: actor.userId === null ? null : integer(actor.userId, 'actor.userId', line), name: text(actor.name, 'actor.name', line) },
      station: o.station === null ? null : text(o.station, 'station', line),
      payload: o.payload,
      prevHash: hash(o.prevHash, 'prevHash', line),
      hash: hash(o.hash, 'hash', line),
    });
  });
  return events;
}

/** Reads an export made by toCsv (its header names the columns; their order may change). */
export function parseCsv(content: string): ChainedEvent[] {
  let rows: Record<string, string>[];
  try {
    rows = parse(content, { columns: true, skip_empty_lines: true, bom: true }) as Record<string, string>[];
  } catch (error) {
    throw new ExportFileError(`not readable as CSV: ${(error as Error).message}`, null);
  }
  const first = rows[0];
  if (first) {
    const missing = CSV_COLUMNS.filter((c) => c !== 'atIso' && !(c in first));
    if (missing.length) throw new ExportFileError(`the header lacks ${missing.join(', ')}`, 1);
  }
  return rows.map((r, i) => {
    const line = i + 2;
    let payload: unknown;
    try {
      payload = JSON.parse(r.payload!);
    } catch {
      throw new ExportFileError('payload is not JSON', line);
    }
    const name = r.actorName ?? '';
    return {
      seq: integer(r.seq, 'seq', line),
      countId: integer(r.countId, 'countId', line),
      type: text(r.type, 'type', line),
      at: integer(r.at, 'at', line),
      actor: name === '' && (r.actorUserId ?? '') === '' ? null : { userId: (r.actorUserId ?? '') === '' ? null : integer(r.actorUserId, 'actorUserId', line), name },
      station: (r.station ?? '') === '' ? null : r.station!,
      payload,
      prevHash: hash(r.prevHash, 'prevHash', line),
      hash: hash(r.hash, 'hash', line),
    };
  });
}

/** By the file's name: .csv is CSV, anything else JSON Lines. */
export function parseExport(content: string, fileName: string): ChainedEvent[] {
  return fileName.toLowerCase().endsWith('.csv') ? parseCsv(content) : parseJsonl(content);
}
