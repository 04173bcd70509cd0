import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { route, type RouteDef } from '../../server/http/route';
import { DEMO_USERS } from '../../server/db/seed';
import { User } from '../../server/models';
import { DEMO } from '../helpers/api';
import { makePng } from '../helpers/png';
import { caller, everyone, isErrorShape, label, mayCall, sampleParams, snapshot, startSecurityApp, urlFor, type Caller } from './support';

/**
 * Who may call what, from the route table: every route with every demo role and signed out; CSRF on every write;
 * deny by default; uploads; and the count log being append-only through every interface. Complements
 * tests/api/access.test.ts (one holder and one non-holder per route, the public list pinned), tests/api/auth.test.ts
 * (CSRF token lifecycle, session fixation, cookie flags) and tests/api/auth-rate-limit.test.ts (sign-in limits).
 */
const t = await startSecurityApp();
afterAll(() => t.stop());
const routes = t.routes;

let callers: Caller[];
beforeAll(async () => {
  callers = await everyone(t);
});

/** Ids no row has, so a permitted caller passes access and then meets validation or 404, never a change. */
function missingParams(r: RouteDef): Record<string, string> {
  return Object.fromEntries(Object.entries(sampleParams(r)).map(([k, v]) => [k, v === '1' ? '999999999' : v]));
}

function send(c: Caller, r: RouteDef, url: string, body: string | undefined, csrf: string | null = c.csrf) {
  let req = c.agent[r.method](url).set('Accept', 'application/json').timeout({ deadline: 5000 });
  if (csrf !== null) req = req.set('X-CSRF-Token', csrf);
  return body === undefined ? req : req.set('Content-Type', 'application/json').send(body);
}

describe('every route x every role and signed out', () => {
  it.each(routes.map((r) => [label(r), r] as const))('%s', async (_l, r) => {
    const url = urlFor(r, missingParams(r));
    const before = await snapshot(t);
    for (const c of callers) {
      const who = c.email ?? 'signed out';
      // An array is never a valid body, so a permitted write stops at validation.
      const res = await send(c, r, url, r.method === 'get' ? undefined : '[]');
      if (mayCall(r, c)) {
        expect([401, 403], `${who}: ${res.status} ${JSON.stringify(res.body)}`).not.toContain(res.status);
        expect(res.status, who).toBeLessThan(500);
        if (res.status >= 400) expect(isErrorShape(res.body), who).toBe(true);
      } else if (c.email) {
        expect(res.status, who).toBe(403);
        expect(res.body, who).toEqual({ error: 'Your roles do not allow this.', code: 'forbidden' });
      } else {
        expect(res.status, who).toBe(401);
        expect(res.body, who).toEqual({ error: 'Sign in to continue.', code: 'unauthenticated' });
      }
    }
    expect(await snapshot(t)).toEqual(before);
  });
});

describe('CSRF on every state-changing route', () => {
  const writes = routes.filter((r) => r.method !== 'get');
  it.each(writes.map((r) => [label(r), r] as const))('%s refuses a missing, a wrong and another session’s token', async (_l, r) => {
    const c = callers.find((x) => mayCall(r, x) && x.email) ?? callers[0]!;
    const other = callers.find((x) => x !== c)!;
    const url = urlFor(r);
    const before = await snapshot(t);
    for (const token of [null, '', 'not-a-token', other.csrf, c.csrf.slice(0, -2) + 'xx']) {
      const res = await send(c, r, url, '{}', token);
      expect(res.status, `token ${JSON.stringify(token)}`).toBe(403);
      expect(res.body).toEqual({ error: 'This form has expired. Reload the page and try again.', code: 'csrf_invalid' });
    }
    expect(await snapshot(t)).toEqual(before);
  });
});

describe('deny by default', () => {
  it('a route cannot be declared without an access rule', () => {
    // @ts-expect-error access is required: the type has no default (typecheck fails if this ever compiles)
    const def = route({ method: 'get', path: '/nothing', handler: () => 1 });
    expect(def.access).toBeUndefined();
    for (const r of routes) expect(r.access, label(r)).toBeDefined();
  });

  it('every method a path does not declare, and unknown paths, are 404 JSON and change nothing', async () => {
    const admin = callers.find((c) => c.email === DEMO.admin)!;
    const before = await snapshot(t);
    const methods = ['get', 'post', 'put', 'patch', 'delete'] as const;
    const paths = [...new Set(routes.map((r) => r.path)), '/nope', '/hazards/1/nope', '/..%2f..%2fetc/passwd', '/%2e%2e/health'];
    for (const p of paths) {
      for (const method of methods) {
        if (routes.some((r) => r.path === p && r.method === method)) continue;
        const url = '/api' + p.replace(/:(\w+)/g, '1');
        const res = await send(admin, { method } as RouteDef, url, method === 'get' ? undefined : '{}');
        // A path another route's pattern matches (GET /procedures/import is GET /procedures/:id) meets that
        // route's validation instead; anything else is "no such route".
        const other = routes.some((r) => r.method === method && new RegExp(`^${r.path.replace(/:\w+/g, '[^/]+')}$`).test(p));
        expect(res.status, `${method} ${url}`).toBe(other ? 400 : 404);
        expect(res.headers['content-type']).toMatch(/^application\/json/);
        expect(res.body.code).toBe(other ? 'validation_failed' : 'not_found');
      }
    }
    expect(await snapshot(t)).toEqual(before);
  });
});

describe('sessions', () => {
  it('every role gets a new session id at sign-in, and the old one stays signed out', async () => {
    for (const u of DEMO_USERS) {
      const anon = await caller(t, null);
      const pre = anon.cookie;
      expect(pre).toMatch(/^holdfire\.sid=/);
      await anon.agent.post('/api/auth/login').set('X-CSRF-Token', anon.csrf).send({ email: u.email, password: 'kestrel-demo' }).expect(200);
      const me = await anon.agent.get('/api/auth/me').expect(200);
      expect(me.body.email).toBe(u.email);
      await request(t.url).get('/api/auth/me').set('Cookie', pre).expect(401);
    }
  });
});

describe('uploads', () => {
  const uploadRoutes = routes.filter((r) => r.before?.some((m) => 'uploadField' in m));
  const PNG = makePng();
  const HTML = Buffer.from('<!doctype html><script>alert(document.cookie)</script>');
  const SVG = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"><script>alert(2)</script></svg>');
  const EXE = Buffer.concat([Buffer.from('MZ'), Buffer.alloc(200)]);

  /** A real target for each upload route; a new upload route fails here until it is given one. */
  async function targetOf(r: RouteDef, c: Caller): Promise<string> {
    switch (label(r)) {
      case 'POST /api/hazards/:id/mitigations/:mid/evidence/files': {
        const h = await c.agent.get('/api/hazards/1').expect(200);
        return `/api/hazards/1/mitigations/${h.body.mitigations[0].id}/evidence/files`;
      }
      case 'POST /api/procedures/:id/revisions/:rev/attachments': {
        const p = await c.agent.get('/api/procedures/1').expect(200);
        let draft = (p.body.revisions as { number: number; status: string }[]).find((x) => x.status === 'draft');
        if (!draft) draft = (await c.agent.post('/api/procedures/1/revisions').set('X-CSRF-Token', c.csrf).expect(201)).body;
        return `/api/procedures/1/revisions/${draft!.number}/attachments`;
      }
      case 'POST /api/anomalies/:id/attachments':
        return '/api/anomalies/1/attachments';
      case 'POST /api/counts/:id/sensors':
        return '/api/counts/1/sensors';
      default:
        throw new Error(`no upload target for ${label(r)}: add one here`);
    }
  }

  it('the table has the upload routes we know of', () => {
    expect(uploadRoutes.map(label).sort()).toEqual(
      [
        'POST /api/anomalies/:id/attachments',
        'POST /api/counts/:id/sensors',
        'POST /api/hazards/:id/mitigations/:mid/evidence/files',
        'POST /api/procedures/:id/revisions/:rev/attachments',
      ].sort(),
    );
  });

  it.each(uploadRoutes.map((r) => [label(r), r] as const))('%s refuses markup, scripts and programs whatever they are called', async (_l, r) => {
    const c = (await caller(t, DEMO.conductor)).email && mayCall(r, { email: DEMO.conductor, roles: ['conductor'] }) ? await caller(t, DEMO.conductor) : await caller(t, DEMO.safety);
    const url = await targetOf(r, c);
    const before = await snapshot(t);
    const spoofs: [Buffer, string, string][] = [
      [HTML, 'photo.png', 'image/png'],
      [HTML, 'notes.txt', 'text/plain'],
      [SVG, 'diagram.svg', 'image/svg+xml'],
      [SVG, 'diagram.png', 'image/png'],
      [EXE, 'valve.pdf', 'application/pdf'],
      [HTML, 'data.csv', 'text/csv'],
    ];
    for (const [bytes, filename, contentType] of spoofs) {
      const res = await c.agent.post(url).set('X-CSRF-Token', c.csrf).attach('file', bytes, { filename, contentType });
      expect(res.status, `${filename}: ${JSON.stringify(res.body)}`).toBeGreaterThanOrEqual(400);
      expect(res.status).toBeLessThan(500);
      expect(isErrorShape(res.body)).toBe(true);
    }
    expect(await snapshot(t)).toEqual(before);
  });

  it.each(uploadRoutes.filter((r) => !r.path.includes('sensors')).map((r) => [label(r), r] as const))(
    '%s stores a file named with ../ under a random name inside the upload store',
    async (_l, r) => {
      const c = await caller(t, DEMO.safety);
      const url = await targetOf(r, c);
      const outside = path.resolve(t.dataDir, 'evil.png');
      const res = await c.agent
        .post(url)
        .set('X-CSRF-Token', c.csrf)
        .attach('file', PNG, { filename: '../../evil.png', contentType: 'image/png' });
      expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
      expect(readdirSync(t.dataDir)).not.toContain('evil.png');
      expect(() => readFileSync(outside)).toThrow();
      const stored = readdirSync(path.join(t.dataDir, 'uploads'));
      expect(stored.every((f) => /^[0-9a-f]{32}\.\w+$/.test(f))).toBe(true);
      // The name shown and sent back in Content-Disposition is the cleaned one.
      const urls = JSON.stringify(res.body).match(/\/api\/uploads\/\d+/g) ?? [];
      expect(urls.length).toBeGreaterThan(0);
      const file = await c.agent.get(urls[urls.length - 1]!).expect(200);
      expect(file.headers['x-content-type-options']).toBe('nosniff');
      expect(String(file.headers['content-disposition'])).not.toContain('..');
      expect(JSON.stringify(res.body)).not.toContain('../');
    },
  );
});

describe('the count log is append-only through every interface', () => {
  const allEvents = () =>
    User.sequelize!.query<{ id: number; hash: string }>('SELECT id, count_id, seq, type, payload, hash FROM count_events ORDER BY id', { type: QueryTypes.SELECT });

  it('the database refuses UPDATE, DELETE, REPLACE and UPSERT of events', async () => {
    const s = User.sequelize!;
    const before = await allEvents();
    const [first] = before as unknown as { id: number; count_id: number; seq: number }[];
    const attempts = [
      `UPDATE count_events SET type = 'count:scrubbed' WHERE id = ${first!.id}`,
      `UPDATE count_events SET hash = hash`,
      `DELETE FROM count_events WHERE id = ${first!.id}`,
      `DELETE FROM count_events`,
      `INSERT OR REPLACE INTO count_events SELECT * FROM count_events WHERE id = ${first!.id}`,
      `REPLACE INTO count_events SELECT * FROM count_events WHERE id = ${first!.id}`,
      `INSERT INTO count_events SELECT * FROM count_events WHERE id = ${first!.id} ON CONFLICT DO UPDATE SET type = 'x'`,
      `DELETE FROM counts WHERE id = ${first!.count_id}`,
    ];
    for (const sql of attempts) {
      const outcome = await s.query(sql).then(
        () => 'done',
        (error: Error) => error.message,
      );
      expect(outcome, sql).not.toBe('done');
    }
    expect(await allEvents()).toEqual(before);
  });

  it('no server code updates or deletes events', () => {
    const files = (dir: string): string[] =>
      readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? files(path.join(dir, e.name)) : [path.join(dir, e.name)]));
    const offenders = files('server')
      .filter((f) => !f.includes(`${path.sep}migrations${path.sep}`))
      .filter((f) => /CountEvent\.(update|destroy|upsert|bulkCreate\([^)]*updateOnDuplicate)|(UPDATE|DELETE FROM|REPLACE INTO)\s+count_events/i.test(readFileSync(f, 'utf8')));
    expect(offenders).toEqual([]);
  });

  it('every route and every role leaves the stored events as they were', async () => {
    const before = await allEvents();
    const countRoutes = routes.filter((r) => r.path.startsWith('/counts'));
    for (const c of callers.filter((x) => x.email)) {
      for (const r of countRoutes) {
        if (!mayCall(r, c)) continue;
        await send(c, r, urlFor(r), r.method === 'get' ? undefined : '{}');
        await send(c, r, urlFor(r), r.method === 'get' ? undefined : JSON.stringify({ type: 'count:scrub', category: 'other', reason: 'x' }));
      }
    }
    const after = await allEvents();
    // Appending is allowed (a command may be accepted); what was stored stays byte for byte.
    expect(after.slice(0, before.length)).toEqual(before);
  });
});
