import { readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  canonicalEvent,
  canonicalJson,
  CanonicalJsonError,
  eventHash,
  GENESIS_HASH,
  verifyChain,
  type ChainedEvent,
  type ChainEventContent,
} from '../../src/domain/count/chain';

/** SHA-256 through Web Crypto, as a browser would supply it (Node 20 has the same globalThis.crypto.subtle). */
async function webSha256(text: string): Promise<string> {
  const digest = await globalThis.crypto.subtle.digest('SHA-256', new TextEncoder().encode(text));
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

const created: ChainEventContent = {
  countId: 1,
  seq: 1,
  type: 'count:created',
  at: 1767225600000,
  actor: { userId: 7, name: 'Ines Okafor' },
  station: 'TC',
  payload: { revision: 3, procedure: 'Kestrel-2 hot fire' },
};
const hold: ChainEventContent = {
  countId: 1,
  seq: 2,
  type: 'hold:called',
  at: 1767225601500,
  actor: null,
  station: 'PAD',
  payload: { reason: 'GN2 bottle low', by: 'PAD' },
};

// The expected hashes were computed outside the project with GNU coreutils sha256sum over
// printf '%s\n%s' "$PREV_HASH" "$CANONICAL_TEXT" (the hash rule in chain.ts), not with this code.
const CREATED_TEXT =
  '{"actor":{"name":"Ines Okafor","userId":7},"at":1767225600000,"countId":1,"payload":{"procedure":"Kestrel-2 hot fire","revision":3},"seq":1,"station":"TC","type":"count:created"}';
const CREATED_HASH = '39ceebe5e4272aecc069ee5d9f270973a29c9d77e72eacbadcdab6aa72f76142';
const HOLD_TEXT = '{"actor":null,"at":1767225601500,"countId":1,"payload":{"by":"PAD","reason":"GN2 bottle low"},"seq":2,"station":"PAD","type":"hold:called"}';
const HOLD_HASH = 'b8df5dbacae054d6ff733acfbe3f672ed70981d64d6c248c7c473485c2fb151f';

async function chain(contents: ChainEventContent[]): Promise<ChainedEvent[]> {
  const out: ChainedEvent[] = [];
  let prev = GENESIS_HASH;
  for (const c of contents) {
    const hash = await eventHash(prev, c, webSha256);
    out.push({ ...c, prevHash: prev, hash });
    prev = hash;
  }
  return out;
}

describe('sha256 wiring', () => {
  it('Web Crypto SHA-256 of "abc" is the FIPS 180-2 Appendix B.1 digest', async () => {
    // Source: FIPS PUB 180-2, Appendix B.1 (SHA-256 example, one-block message "abc").
    expect(await webSha256('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});

describe('canonicalJson', () => {
  it('writes the RFC 8785 section 3.2.2 example as the RFC does (numbers, strings, literals, sorted keys)', () => {
    // Source: RFC 8785 (JSON Canonicalization Scheme) section 3.2.2, input and expected output.
    const input = JSON.parse(
      '{"numbers":[333333333.33333329,1E30,4.50,2e-3,0.000000000000000000000000001],"string":"\\u20ac$\\u000F\\u000aA\'\\u0042\\u0022\\u005c\\\\\\"\\/","literals":[null,true,false]}',
    ) as unknown;
    expect(canonicalJson(input)).toBe(
      '{"literals":[null,true,false],"numbers":[333333333.3333333,1e+30,4.5,0.002,1e-27],"string":"€$\\u000f\\nA\'B\\"\\\\\\\\\\"/"}',
    );
  });

  it('sorts keys by UTF-16 code units, so an emoji (surrogate pair) sorts before U+FB33', () => {
    // RFC 8785 section 3.2.3 sorting example (from memory); the order follows from UTF-16 code unit comparison.
    const input = { '\u20ac': 'Euro Sign', '\r': 'Carriage Return', '\ufb33': 'Hebrew Letter Dalet With Dagesh', '1': 'One', '\ud83d\ude00': 'Emoji: Grinning Face', '\u0080': 'Control', '\u00f6': 'Latin Small Letter O With Diaeresis' };
    // Read the order from the text: JSON.parse would put the integer-like key "1" first whatever the text says.
    const order = [...canonicalJson(input).matchAll(/"([^"]*)":"[^"]*"/g)].map((m) => JSON.parse(`"${m[1]}"`) as string);
    expect(order).toEqual(['\r', '1', '\u0080', '\u00f6', '\u20ac', '\ud83d\ude00', '\ufb33']);
  });

  it('sorts nested keys, leaves array order alone, drops undefined members and refuses what JSON cannot carry', () => {
    expect(canonicalJson({ b: [{ z: 1, a: 2 }, 3], a: { d: undefined, c: null } })).toBe('{"a":{"c":null},"b":[{"a":2,"z":1},3]}');
    expect(canonicalJson([undefined, -0])).toBe('[null,0]');
    expect(() => canonicalJson({ x: Number.NaN })).toThrow(CanonicalJsonError);
    expect(() => canonicalJson({ x: Infinity })).toThrow(CanonicalJsonError);
    expect(() => canonicalJson({ x: 1n })).toThrow(CanonicalJsonError);
    expect(() => canonicalJson({ when: new Map() })).toThrow(/\$\.when is not a plain object/);
  });
});

describe('canonicalEvent and the hash rule', () => {
  it('gives the canonical text written out by hand', () => {
    expect(canonicalEvent(created)).toBe(CREATED_TEXT);
    expect(canonicalEvent(hold)).toBe(HOLD_TEXT);
  });

  it('chains hashes as computed independently with sha256sum', async () => {
    const [a, b] = await chain([created, hold]);
    expect(a!.prevHash).toBe('0'.repeat(64));
    expect(a!.hash).toBe(CREATED_HASH);
    expect(b!.prevHash).toBe(CREATED_HASH);
    expect(b!.hash).toBe(HOLD_HASH);
  });

  it('ignores fields outside the canonical form (such as a commandId) and the key order of the input', async () => {
    const reordered = { payload: { procedure: 'Kestrel-2 hot fire', revision: 3 }, station: 'TC', actor: { name: 'Ines Okafor', userId: 7 }, at: 1767225600000, type: 'count:created', seq: 1, countId: 1 };
    expect(canonicalEvent({ ...reordered, commandId: 'c-1' } as ChainEventContent)).toBe(CREATED_TEXT);
  });
});

describe('canonicalEvent with the payload already written', () => {
  it('gives the hand-written texts', () => {
    expect(canonicalEvent(created, canonicalJson(created.payload))).toBe(CREATED_TEXT);
    expect(canonicalEvent(hold, canonicalJson(hold.payload))).toBe(HOLD_TEXT);
  });

  it('is the same text as writing the whole event, for any event', () => {
    const json = fc.letrec((tie) => ({
      value: fc.oneof(
        { depthSize: 'small' },
        fc.constant(null),
        fc.boolean(),
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.string({ unit: 'binary' }),
        fc.array(tie('value'), { maxLength: 4 }),
        fc.dictionary(fc.string({ unit: 'binary' }), tie('value'), { maxKeys: 4 }),
      ),
    })).value;
    const event = fc.record({
      countId: fc.integer({ min: 1 }),
      seq: fc.integer({ min: 1 }),
      type: fc.string({ unit: 'binary' }),
      at: fc.integer(),
      actor: fc.option(fc.record({ userId: fc.option(fc.integer()), name: fc.string({ unit: 'binary' }) })),
      station: fc.option(fc.string({ unit: 'binary' })),
      payload: json,
    });
    fc.assert(
      fc.property(event, (e) => {
        expect(canonicalEvent(e, canonicalJson(e.payload))).toBe(canonicalEvent(e));
      }),
      { numRuns: 500 },
    );
  });
});

describe('verifyChain', () => {
  const contents: ChainEventContent[] = [1, 2, 3, 4].map((seq) => ({ ...hold, seq, at: hold.at + seq, payload: { reading: seq * 10 } }));

  it('accepts an intact chain and an empty one', async () => {
    expect(await verifyChain(await chain(contents), webSha256)).toEqual({ ok: true, count: 4 });
    expect(await verifyChain([], webSha256)).toEqual({ ok: true, count: 0 });
  });

  it('names the event whose content changed', async () => {
    const events = await chain(contents);
    events[2] = { ...events[2]!, payload: { reading: 31 } };
    expect(await verifyChain(events, webSha256)).toMatchObject({ ok: false, seq: 3, reason: 'hash-mismatch' });
  });

  it('names the next event when a changed event was re-hashed to match', async () => {
    const events = await chain(contents);
    const forged = { ...events[1]!, station: 'TC' };
    events[1] = { ...forged, hash: await eventHash(forged.prevHash, forged, webSha256) };
    expect(await verifyChain(events, webSha256)).toMatchObject({ ok: false, seq: 3, reason: 'prev-hash-mismatch' });
  });

  it('names a gap in seq, a missing first event and an event of another count', async () => {
    const events = await chain(contents);
    expect(await verifyChain([events[0]!, events[2]!, events[3]!], webSha256)).toMatchObject({ ok: false, seq: 3, reason: 'seq-gap' });
    expect(await verifyChain(events.slice(1), webSha256)).toMatchObject({ ok: false, seq: 2, reason: 'seq-gap' });
    const other = [events[0]!, { ...events[1]!, countId: 2 }];
    expect(await verifyChain(other, webSha256)).toMatchObject({ ok: false, seq: 2, reason: 'wrong-count' });
  });

  it('names a changed time or actor', async () => {
    const events = await chain(contents);
    events[0] = { ...events[0]!, at: events[0]!.at - 1000 };
    expect(await verifyChain(events, webSha256)).toMatchObject({ ok: false, seq: 1, reason: 'hash-mismatch' });
    const again = await chain(contents);
    again[3] = { ...again[3]!, actor: { userId: 2, name: 'Someone Else' } };
    expect(await verifyChain(again, webSha256)).toMatchObject({ ok: false, seq: 4, reason: 'hash-mismatch' });
  });
});

describe('chain.ts purity', () => {
  it('imports nothing and reads no clock', () => {
    const text = readFileSync(new URL('../../src/domain/count/chain.ts', import.meta.url), 'utf8');
    expect(text).not.toMatch(/^import /m);
    expect(text).not.toMatch(/Date\.now|new Date\(|Math\.random|process\.|require\(/);
  });
});
