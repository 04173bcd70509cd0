/**
 * The hash chain over a count's event log. Pure: the SHA-256 function is passed in (Node's crypto on the
 * server, Web Crypto in a browser), so the same check runs for the server, the phone and an auditor.
 *
 * Canonical form of an event (docs/count-log.md has the long version):
 *   the JSON text of { actor, at, countId, payload, seq, station, type } with
 *   - object keys sorted at every depth by UTF-16 code units (JavaScript's default string order),
 *   - no whitespace, strings and numbers written as JSON.stringify writes them,
 *   - object members whose value is undefined left out; undefined in an array written as null (as JSON.stringify);
 *   - actor = { name, userId } or null, station = string or null.
 * These are the ordering and primitive rules of RFC 8785 (JSON Canonicalization Scheme).
 * A value JSON cannot carry exactly (NaN, Infinity, bigint, a function, a Date or other class instance) is refused.
 *
 * Hash rule: hash = lowercase hex SHA-256 of the UTF-8 text `prevHash + '\n' + canonicalEvent(e)`;
 * the first event's prevHash is 64 zeros.
 */

export const GENESIS_HASH = '0'.repeat(64);

export interface EventActor {
  userId: number | null;
  name: string;
}

/** The fields the hash covers. commandId is an idempotency key only and is not hashed. */
export interface ChainEventContent {
  countId: number;
  seq: number;
  type: string;
  /** Epoch milliseconds, server time. */
  at: number;
  actor: EventActor | null;
  station: string | null;
  payload: unknown;
}

export interface ChainedEvent extends ChainEventContent {
  prevHash: string;
  hash: string;
}

export type Sha256Hex = (text: string) => Promise<string>;

export type ChainVerdict =
  | { ok: true; count: number }
  | { ok: false; seq: number; reason: 'seq-gap' | 'prev-hash-mismatch' | 'hash-mismatch' | 'wrong-count'; detail: string };

export class CanonicalJsonError extends Error {}

/** The canonical JSON text of a JSON-compatible value (see the header for the rules). */
export function canonicalJson(value: unknown): string {
  return write(value, '$');
}

function write(value: unknown, path: string): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'boolean':
      return value ? 'true' : 'false';
    case 'string':
      return JSON.stringify(value);
    case 'number':
      if (!Number.isFinite(value)) throw new CanonicalJsonError(`${path} is ${value}, which JSON cannot carry`);
      return JSON.stringify(value);
    case 'object': {
      if (Array.isArray(value)) return `[${value.map((v, i) => (v === undefined ? 'null' : write(v, `${path}[${i}]`))).join(',')}]`;
      const proto = Object.getPrototypeOf(value) as unknown;
      if (proto !== Object.prototype && proto !== null) throw new CanonicalJsonError(`${path} is not a plain object`);
      const record = value as Record<string, unknown>;
      const members = Object.keys(record)
        .filter((k) => record[k] !== undefined)
        .sort()
        .map((k) => `${JSON.stringify(k)}:${write(record[k], `${path}.${k}`)}`);
      return `{${members.join(',')}}`;
    }
    default:
      throw new CanonicalJsonError(`${path} is a ${typeof value}, which JSON cannot carry`);
  }
}

/**
 * The canonical text of one event: what its hash covers, after the previous hash. `payloadJson`, when the caller
 * has it already, is `canonicalJson(e.payload)`: the payload is then not written a second time.
 */
export function canonicalEvent(e: ChainEventContent, payloadJson?: string): string {
  const actor = e.actor === null ? null : { userId: e.actor.userId, name: e.actor.name };
  if (payloadJson === undefined) {
    return canonicalJson({ countId: e.countId, seq: e.seq, type: e.type, at: e.at, actor, station: e.station, payload: e.payload });
  }
  // The usual event, written out directly in the members' sorted order (actor, at, countId, payload, seq, station,
  // type); anything of another shape goes the general way, which also refuses what JSON cannot carry.
  const { at, countId, seq, station, type } = e;
  if (
    Number.isFinite(at) &&
    Number.isFinite(countId) &&
    Number.isFinite(seq) &&
    typeof type === 'string' &&
    (station === null || typeof station === 'string') &&
    (actor === null || (typeof actor.name === 'string' && (actor.userId === null || Number.isFinite(actor.userId))))
  ) {
    const who = actor === null ? 'null' : `{"name":${JSON.stringify(actor.name)},"userId":${JSON.stringify(actor.userId)}}`;
    const where = station === null ? 'null' : JSON.stringify(station);
    return `{"actor":${who},"at":${JSON.stringify(at)},"countId":${JSON.stringify(countId)},"payload":${payloadJson},"seq":${JSON.stringify(seq)},"station":${where},"type":${JSON.stringify(type)}}`;
  }
  const before = canonicalJson({ actor, at, countId });
  const after = canonicalJson({ seq, station, type });
  return `${before.slice(0, -1)},"payload":${payloadJson},${after.slice(1)}`;
}

/** The text the hash rule hashes: the previous hash, a newline and the event's canonical text. */
export function hashedText(prevHash: string, e: ChainEventContent, payloadJson?: string): string {
  return `${prevHash}\n${canonicalEvent(e, payloadJson)}`;
}

/** The hash of an event given the previous event's hash (GENESIS_HASH for seq 1). */
export function eventHash(prevHash: string, e: ChainEventContent, sha256: Sha256Hex): Promise<string> {
  return sha256(hashedText(prevHash, e));
}

/**
 * Checks a count's events in seq order from seq 1: each seq is the previous one plus one, each prevHash is
 * the previous event's hash (64 zeros first), and each hash is recomputed from the event's content. Names the
 * first event that fails. A chain cannot show that events were cut from its end: compare the last hash with
 * one kept elsewhere for that.
 */
export async function verifyChain(events: readonly ChainedEvent[], sha256: Sha256Hex): Promise<ChainVerdict> {
  let prevHash = GENESIS_HASH;
  let expectedSeq = 1;
  const countId = events[0]?.countId;
  for (const e of events) {
    if (e.countId !== countId) return { ok: false, seq: e.seq, reason: 'wrong-count', detail: `event of count ${e.countId} among count ${countId}` };
    if (e.seq !== expectedSeq) {
      return { ok: false, seq: e.seq, reason: 'seq-gap', detail: `expected seq ${expectedSeq}, found ${e.seq}` };
    }
    if (e.prevHash !== prevHash) {
      return { ok: false, seq: e.seq, reason: 'prev-hash-mismatch', detail: 'prevHash is not the previous event\'s hash' };
    }
    const hash = await eventHash(prevHash, e, sha256);
    if (hash !== e.hash) return { ok: false, seq: e.seq, reason: 'hash-mismatch', detail: 'the stored hash does not match the content' };
    prevHash = e.hash;
    expectedSeq += 1;
  }
  return { ok: true, count: events.length };
}
