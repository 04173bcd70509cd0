import { parse as parseQueryString } from 'node:querystring';
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import type { RouteDef } from '../../server/http/route';
import { DEMO_USERS } from '../../server/db/seed';
import {
  caller,
  check,
  isErrorShape,
  label,
  fieldNames,
  nastyBody,
  nastyString,
  nastyParam,
  nastyQuery,
  sampleParams,
  snapshot,
  startSecurityApp,
  urlFor,
  type Caller,
} from './support';

/**
 * Bad input to every route of the table the app is built from (a route added later is fuzzed without touching
 * this file). Each generated input is one the route's own schema refuses; the server must answer it with a 4xx
 * in the one error shape, in time, and leave every table as it was.
 */
const t = await startSecurityApp({ signInLimits: { windowMs: 60_000, limit: 100_000 } });
afterAll(() => t.stop());

const RUNS = Number(process.env.HOLDFIRE_FUZZ_RUNS ?? 6);
const TIMEOUT_MS = 5000;

const callers = new Map<string, Caller>();
/** Someone the route lets in, so the input reaches validation: signed out for public routes. */
async function callerFor(r: RouteDef): Promise<Caller> {
  const email =
    r.access === 'public' ? null : r.access === 'signed-in' ? DEMO_USERS[0]!.email : DEMO_USERS.find((u) => u.roles.some((role) => (r.access as string[]).includes(role)))!.email;
  const key = email ?? '(signed out)';
  if (!callers.has(key)) callers.set(key, await caller(t, email));
  return callers.get(key)!;
}

function send(c: Caller, r: RouteDef, url: string, body?: string) {
  const req = c.agent[r.method](url).set('X-CSRF-Token', c.csrf).set('Accept', 'application/json').timeout({ deadline: TIMEOUT_MS });
  if (body === undefined) return req;
  return req.set('Content-Type', 'application/json').send(body);
}

/** The answer to refused input: a 4xx, JSON, in the one error shape; and every table as it was. */
async function expectRefused(r: RouteDef, what: string, run: () => Promise<{ status: number; body: unknown; headers: Record<string, string> }>) {
  const before = await snapshot(t);
  const res = await run();
  const where = `${label(r)} ${what.slice(0, 300)}`;
  expect(res.status, `${where} -> ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`).toBeGreaterThanOrEqual(400);
  expect(res.status, `${where} -> ${res.status}`).toBeLessThan(500);
  expect(String(res.headers['content-type']), where).toMatch(/^application\/json/);
  expect(isErrorShape(res.body), `${where} -> ${JSON.stringify(res.body)}`).toBe(true);
  expect(await snapshot(t), `${where} changed the database`).toEqual(before);
}

function decoded(raw: string): string | null {
  try {
    return decodeURIComponent(raw);
  } catch {
    return null;
  }
}

const routes = t.routes;
const withParams = routes.filter((r) => r.path.includes(':'));
const withQuery = routes.filter((r) => r.query);
const writes = routes.filter((r) => r.method !== 'get');
const plainGets = routes.filter((r) => r.method === 'get' && !r.query);

describe('fuzzed path parameters', () => {
  it.each(withParams.map((r) => [label(r), r] as const))('%s', async (_l, r) => {
    const c = await callerFor(r);
    const good = sampleParams(r);
    const names = Object.keys(good);
    const arb = fc
      .record(Object.fromEntries(names.map((n) => [n, fc.option(nastyParam, { nil: undefined, freq: 3 })])))
      .map((o) => Object.fromEntries(names.map((n) => [n, (o[n] as string | undefined) ?? good[n]!])))
      .filter((p) => {
        if (names.every((n) => p[n] === good[n])) return false;
        const values = Object.fromEntries(names.map((n) => [n, decoded(p[n]!)]));
        if (Object.values(values).some((v) => v === null)) return true;
        return !r.params || !r.params.safeParse(values).success;
      });
    await check(arb, async (params) => {
        const url = urlFor(r, params, false);
        await expectRefused(r, url, () => send(c, r, url, r.method === 'get' ? undefined : '{}'));
      }, RUNS);
  });
});

describe('fuzzed query strings', () => {
  it.each(withQuery.map((r) => [label(r), r] as const))('%s', async (_l, r) => {
    const c = await callerFor(r);
    const base = urlFor(r);
    const arb = nastyQuery(r.query).filter((qs) => !r.query!.safeParse({ ...parseQueryString(qs) }).success);
    await check(arb, async (qs) => {
        await expectRefused(r, qs, () => send(c, r, `${base}?${qs}`));
      }, RUNS);
  });

  // A read without a query schema ignores its query: it must still never fail or write.
  it.each(plainGets.map((r) => [label(r), r] as const))('%s ignores a strange query without failing', async (_l, r) => {
    const c = await callerFor(r);
    const base = urlFor(r);
    await check(nastyQuery(undefined), async (qs) => {
        const before = await snapshot(t);
        const res = await send(c, r, `${base}?${qs}`);
        expect(res.status, `${label(r)}?${qs} -> ${res.status}`).toBeLessThan(500);
        expect(await snapshot(t)).toEqual(before);
      }, Math.max(2, Math.floor(RUNS / 2)));
  });
});

describe('fuzzed bodies', () => {
  it.each(writes.map((r) => [label(r), r] as const))('%s', async (_l, r) => {
    const c = await callerFor(r);
    const url = urlFor(r);
    const arb = nastyBody(r.body).filter((text) => {
      let value: unknown;
      try {
        value = JSON.parse(text);
      } catch {
        return true;
      }
      // What the route would check: its body schema, or "no body at all" for a write that declares none.
      if (!r.body) return !(value && typeof value === 'object' && !Array.isArray(value) && Object.keys(value).length === 0);
      return !r.body.safeParse(value).success;
    });
    await check(arb, async (text) => {
        await expectRefused(r, text, () => send(c, r, url, text));
      }, RUNS);
  });
});

describe('fuzzed multipart uploads', () => {
  const uploads = routes.filter((r) => r.before?.some((m) => 'uploadField' in m));
  it('finds the upload routes', () => expect(uploads.length).toBeGreaterThanOrEqual(4));

  it.each(uploads.map((r) => [label(r), r] as const))('%s', async (_l, r) => {
    const c = await callerFor(r);
    const url = urlFor(r);
    const fieldName = fc.oneof(fc.constantFrom(...fieldNames(r.body), '__proto__', 'constructor', 'file', 'file[]', ''), fc.string({ maxLength: 20 }));
    const fieldValue = nastyString.filter((s) => s.length < 6000);
    // Bytes no sniffer takes for a file type (a NUL first: not text, no known signature), so nothing may be kept.
    const bytes = fc.uint8Array({ maxLength: 512 }).map((b) => Buffer.concat([Buffer.from([0]), Buffer.from(b)]));
    const arb = fc.record({
      fields: fc.array(fc.tuple(fieldName, fieldValue), { maxLength: 4 }),
      file: fc.option(fc.record({ bytes, name: nastyString.filter((s) => s.length < 300), type: fc.constantFrom('image/png', 'text/plain', 'application/pdf', 'text/html', '') })),
    });
    await check(arb, async ({ fields, file }) => {
      await expectRefused(r, JSON.stringify({ fields, file: file && { ...file, bytes: file.bytes.length } }), () => {
        let req = c.agent.post(url).set('X-CSRF-Token', c.csrf).set('Accept', 'application/json').timeout({ deadline: TIMEOUT_MS });
        for (const [k, v] of fields) req = req.field(k, v);
        if (file) req = req.attach('file', file.bytes, { filename: file.name || 'x', contentType: file.type || 'application/octet-stream' });
        else req = req.field('note', 'no file');
        return req;
      });
    }, RUNS);
  });
});
