/**
 * Shared by the security suite: the route table as the running app has it, a client per demo role, a cheap
 * snapshot of every table (to prove bad input changed nothing) and the generators of bad input.
 */
import { readdirSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import fc from 'fast-check';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import type { ZodType } from 'zod';
import type { RouteDef } from '../../server/http/route';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/db/seed';
import { User } from '../../server/models';
import { PROPELLANT_IDS } from '../../src/domain/propellants/library';
import { hasAnyRole, type Role } from '../../src/domain/people/roles';
import { startTestApp, type TestApp } from '../helpers/app';

export const label = (r: RouteDef) => `${r.method.toUpperCase()} /api${r.path}`;

export interface SecurityApp extends TestApp {
  url: string;
  routes: RouteDef[];
}

/** The real server (temporary SQLite, demo seed) listening on a loopback port, for HTTP and sockets alike. */
export async function startSecurityApp(options: Parameters<typeof startTestApp>[0] = {}): Promise<SecurityApp> {
  const t = await startTestApp(options);
  await new Promise<void>((resolve) => t.holdfire.httpServer.listen(0, '127.0.0.1', resolve));
  const url = `http://127.0.0.1:${(t.holdfire.httpServer.address() as AddressInfo).port}`;
  return { ...t, url, routes: t.holdfire.routes };
}

/** A signed-in (or anonymous) cookie-keeping client talking to the listening server, with its CSRF token. */
export interface Caller {
  email: string | null;
  roles: readonly Role[];
  agent: ReturnType<typeof request.agent>;
  csrf: string;
  cookie: string;
}

export async function caller(t: SecurityApp, email: string | null): Promise<Caller> {
  const agent = request.agent(t.url);
  let csrf = (await agent.get('/api/auth/csrf').expect(200)).body.csrfToken as string;
  if (email) {
    await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email, password: DEMO_PASSWORD }).expect(200);
    csrf = (await agent.get('/api/auth/csrf').expect(200)).body.csrfToken as string;
  }
  const jar = (agent as unknown as { jar: { getCookie(name: string, opts: object): { value: string } | undefined } }).jar;
  const sid = jar.getCookie('holdfire.sid', { domain: '127.0.0.1', path: '/', secure: false, script: false });
  const roles = email ? (DEMO_USERS.find((u) => u.email === email)?.roles ?? (await User.findOne({ where: { email } }))!.roles) : [];
  return { email, roles, agent, csrf, cookie: sid ? `holdfire.sid=${sid.value}` : '' };
}

/** Every demo person plus a signed-out caller, each signed in once. */
export async function everyone(t: SecurityApp): Promise<Caller[]> {
  const list: Caller[] = [await caller(t, null)];
  for (const u of DEMO_USERS) list.push(await caller(t, u.email));
  return list;
}

/** Whether the route's own access rule lets this caller through. */
export function mayCall(r: RouteDef, c: Pick<Caller, 'email' | 'roles'>): boolean {
  if (r.access === 'public') return true;
  if (!c.email) return false;
  if (r.access === 'signed-in') return true;
  return hasAnyRole(c.roles, r.access);
}

// ---------------------------------------------------------------- path parameters

const PARAM_CANDIDATES = ['1', ...PROPELLANT_IDS, 'A'.repeat(43)];

/** Values for the route's path parameters that its params schema accepts (ids of seeded rows where it matters). */
export function sampleParams(r: RouteDef): Record<string, string> {
  const names = [...r.path.matchAll(/:(\w+)/g)].map((m) => m[1]!);
  const values: Record<string, string> = Object.fromEntries(names.map((n) => [n, '1']));
  if (!r.params) return values;
  for (const name of names) {
    for (const candidate of PARAM_CANDIDATES) {
      const trial = { ...values, [name]: candidate };
      const result = r.params.safeParse(trial);
      if (result.success || !result.error.issues.some((i) => i.path[0] === name)) {
        values[name] = candidate;
        break;
      }
    }
  }
  return values;
}

export function urlFor(r: RouteDef, params: Record<string, string> = sampleParams(r), encode = true): string {
  return '/api' + r.path.replace(/:(\w+)/g, (_m, name: string) => (encode ? encodeURIComponent(params[name]!) : params[name]!));
}

// ---------------------------------------------------------------- "nothing changed"

const SKIPPED_TABLES = new Set(['sessions', 'sqlite_sequence', 'schema_migrations']);
let snapshotSql: string | undefined;

/**
 * Row count and newest change of every table, the autoincrement counters and the files in the upload store.
 * Sessions are left out: reading a CSRF token may store one.
 */
export async function snapshot(t: TestApp): Promise<Record<string, unknown>> {
  const sequelize = User.sequelize!;
  if (!snapshotSql) {
    const tables = (await sequelize.query<{ name: string }>("SELECT name FROM sqlite_master WHERE type = 'table'", { type: QueryTypes.SELECT }))
      .map((r) => r.name)
      .filter((n) => !SKIPPED_TABLES.has(n));
    const parts: string[] = [];
    for (const name of tables) {
      const cols = (await sequelize.query<{ name: string }>(`PRAGMA table_info("${name}")`, { type: QueryTypes.SELECT })).map((c) => c.name);
      const newest = cols.includes('updated_at') ? 'max(updated_at)' : 'max(rowid)';
      parts.push(`SELECT '${name}' AS t, count(*) AS n, ${newest} AS m FROM "${name}"`);
    }
    parts.push(`SELECT 'seq:' || name AS t, seq AS n, NULL AS m FROM sqlite_sequence`);
    snapshotSql = parts.join(' UNION ALL ');
  }
  const rows = await sequelize.query<{ t: string; n: number; m: unknown }>(snapshotSql, { type: QueryTypes.SELECT });
  let files: string[] = [];
  try {
    files = readdirSync(path.join(t.dataDir, 'uploads')).sort();
  } catch {
    files = [];
  }
  return { ...Object.fromEntries(rows.map((r) => [r.t, `${r.n} ${String(r.m)}`])), files: files.join(' ') };
}

// ---------------------------------------------------------------- bad input

/** Strings that have broken parsers, databases and renderers elsewhere. */
export const NASTY_STRINGS = [
  '',
  ' ',
  '\u0000',
  'a\u0000b',
  '\uD800',
  'x\uDC00y',
  '\u202Egnp.exe',
  'שלום עולם',
  '🚀'.repeat(50),
  'e\u0301\u0301\u0301',
  '<img src=x onerror=alert(1)>',
  "'; DROP TABLE users; --",
  '../../../etc/passwd',
  '%00',
  '\r\nSet-Cookie: x=1',
  '__proto__',
  'constructor',
  '{{7*7}}',
  'NaN',
  '-0',
  '1e308',
  'true',
  'null',
];

export const ODD_NUMBERS = [NaN, Infinity, -Infinity, -0, 1e308, -1e308, 0.5, -1, 2 ** 53 + 1, 5e-324, 1e21, 999_999_999_999];

const PROTO_KEYS = ['__proto__', 'constructor', 'prototype'];

/** Field names the schema knows (top level, across union options), so generated bodies reach its checks. */
export function fieldNames(schema: ZodType | undefined): string[] {
  const names = new Set<string>();
  const visit = (s: unknown, depth: number) => {
    if (!s || depth > 4) return;
    const def = (s as { _zod?: { def?: Record<string, unknown> } })._zod?.def;
    if (!def) return;
    const shape = def.shape as Record<string, unknown> | undefined;
    if (shape) for (const k of Object.keys(shape)) names.add(k);
    for (const key of ['innerType', 'in', 'out', 'schema']) if (def[key]) visit(def[key], depth + 1);
    for (const option of (def.options as unknown[] | undefined) ?? []) visit(option, depth + 1);
  };
  visit(schema, 0);
  return [...names];
}

export const nastyString = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...NASTY_STRINGS) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 1, arbitrary: fc.string({ unit: 'grapheme', maxLength: 40 }) },
  { weight: 1, arbitrary: fc.constantFrom(60_000, 150_000).map((n) => 'x'.repeat(n)) },
);

const leaf = fc.oneof(
  nastyString,
  fc.constantFrom(...ODD_NUMBERS),
  fc.integer(),
  fc.double(),
  fc.boolean(),
  fc.constant(null),
);

/** Any JSON-ish value, with prototype keys and the schema's own field names among the keys. */
export function nastyValue(keys: string[]) {
  const key = fc.oneof(fc.constantFrom(...keys, ...PROTO_KEYS), fc.string({ maxLength: 12 }));
  return fc.letrec((tie) => ({
    value: fc.oneof({ depthSize: 'small', withCrossShrink: true }, leaf, tie('array'), tie('object')),
    array: fc.array(tie('value'), { maxLength: 4 }),
    object: fc.dictionary(key, tie('value'), { maxKeys: 6 }),
  })).value;
}

/**
 * JSON text the way an attacker writes it: numbers out of range (1e400 reads as Infinity), -0, and sometimes no
 * valid JSON at all. JSON.stringify would turn NaN and Infinity into null, so the text is written here.
 */
export function toJsonText(value: unknown): string {
  if (typeof value === 'number') {
    if (Number.isNaN(value)) return '1e400';
    if (value === Infinity) return '1e400';
    if (value === -Infinity) return '-1e400';
    if (Object.is(value, -0)) return '-0';
    return JSON.stringify(value);
  }
  if (Array.isArray(value)) return `[${value.map(toJsonText).join(',')}]`;
  if (value && typeof value === 'object') {
    return `{${Object.entries(value).map(([k, v]) => `${JSON.stringify(k)}:${toJsonText(v)}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

/** A body: an object of the schema's fields with wrong values and extra keys, or not an object at all, or broken JSON. */
export function nastyBody(schema: ZodType | undefined) {
  const keys = fieldNames(schema);
  const fields = keys.length > 0 ? keys : ['x'];
  const value = nastyValue(fields);
  const objectOfFields = fc
    .record(Object.fromEntries(fields.map((k) => [k, value])), { requiredKeys: [] })
    .chain((o) => fc.dictionary(fc.constantFrom(...PROTO_KEYS, 'extra', 'id', 'teamId', 'role'), value, { maxKeys: 2 }).map((extra) => ({ ...o, ...extra })));
  return fc.oneof(
    { weight: 5, arbitrary: objectOfFields.map(toJsonText) },
    { weight: 1, arbitrary: fc.array(objectOfFields, { maxLength: 2 }).map(toJsonText) },
    { weight: 1, arbitrary: leaf.map(toJsonText) },
    { weight: 1, arbitrary: fc.constantFrom('{', '{"a":1}}', "{'a':1}", 'NaN', '{"a":NaN}', '\u0000', '[', '{"__proto__":') },
  );
}

/** Percent-encoding that also writes bytes no UTF-8 decoder accepts (a lone surrogate as ED A0 80). */
export function pct(s: string): string {
  let out = '';
  for (const ch of s) {
    const code = ch.codePointAt(0)!;
    if (code >= 0xd800 && code <= 0xdfff) out += '%ED%A0%80';
    else out += encodeURIComponent(ch);
  }
  return out;
}

/** Short enough for a URL: Node itself answers 431 without the app to request lines over 16 kB. */
const urlString = nastyString.filter((s) => s.length < 3000);

export const nastyQueryValue = fc.oneof(
  urlString.map(pct),
  fc.constantFrom(...ODD_NUMBERS).map((n) => pct(String(n))),
  fc.constantFrom('%', '%E0%A4%A', '%FF', '%C0%AF', '%2e%2e%2f', '+', '%0d%0a'),
);

export function nastyQuery(schema: ZodType | undefined) {
  const keys = [...fieldNames(schema), ...PROTO_KEYS, 'x', 'a[b]'];
  return fc
    .array(fc.tuple(fc.constantFrom(...keys), nastyQueryValue), { minLength: 1, maxLength: 5 })
    .map((pairs) => pairs.map(([k, v]) => `${pct(k)}=${v}`).join('&'));
}

export const nastyParam = fc.oneof(
  fc.constantFrom('abc', '-1', '0', '1.5', '1e3', '0x10', ' 1', '1 ', '+1', '01', 'NaN', 'Infinity', '-0', '99999999999999999999', '4294967296', '9'.repeat(400)).map(pct),
  fc.constantFrom('%00', '%ED%A0%80', '%FF', '%', '..', '%2e%2e', '%2F', '__proto__', 'constructor', '1%0A'),
  urlString.filter((s) => s.length > 0).map(pct),
);

/** The app's one error shape, for a 4xx. */
export function isErrorShape(body: unknown): boolean {
  const b = body as { error?: unknown; code?: unknown };
  return typeof b?.error === 'string' && b.error.length > 0 && typeof b.code === 'string' && b.code.length > 0;
}

/** Long runs of one character shortened, so a counterexample with a 150 kB string stays readable. */
export function shorten(text: string): string {
  return text.replace(/([\s\S])\1{40,}/g, (run, ch: string) => `${ch}…(${run.length} times)`).slice(0, 4000);
}

/** fc.assert with a short report (huge generated strings shortened). */
export async function check<T>(arb: fc.Arbitrary<T>, predicate: (value: T) => Promise<void>, numRuns: number): Promise<void> {
  await fc.assert(fc.asyncProperty(arb, predicate), {
    numRuns,
    includeErrorInReport: true,
    reporter: (details) => {
      if (details.failed) throw new Error(shorten(fc.defaultReportMessage(details) ?? 'property failed'));
    },
  });
}
