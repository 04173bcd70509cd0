import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import pg from 'pg';
import request from 'supertest';
import type { SignInLimits } from '../../server/auth/rate-limit';
import { startHoldfire, type Holdfire } from '../../server/bootstrap';
import { DEMO_PASSWORD } from '../../server/db/seed';

export interface TestApp {
  holdfire: Holdfire;
  dataDir: string;
  /** A cookie-keeping client with a fresh CSRF token, optionally signed in. */
  client(email?: string, password?: string): Promise<TestClient>;
  stop(): Promise<void>;
}

export interface TestClient {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
  /** Fetch a new CSRF token (the session is regenerated at sign-in and sign-out). */
  refreshCsrf(): Promise<string>;
  post(url: string, body?: object): request.Test;
  patch(url: string, body?: object): request.Test;
  get(url: string): request.Test;
}

/** The PostgreSQL server of `npm run test:scale` (its DATABASE_URL names the admin database), if any. */
export const POSTGRES_ADMIN_URL = /^postgres(ql)?:/.test(process.env.DATABASE_URL ?? '') ? process.env.DATABASE_URL! : undefined;

/** Why a SQLite-only test is skipped on PostgreSQL, for describe.skipIf(onPostgres) and the log. */
export const onPostgres = POSTGRES_ADMIN_URL !== undefined;

async function adminQuery(sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: POSTGRES_ADMIN_URL });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/** A fresh, empty database on the test PostgreSQL server; drop() removes it (and ends its connections). */
export async function createTestDatabase(): Promise<{ url: string; drop(): Promise<void> }> {
  const name = `holdfire_t_${randomBytes(6).toString('hex')}`;
  await adminQuery(`CREATE DATABASE ${name}`);
  const url = new URL(POSTGRES_ADMIN_URL!);
  url.pathname = `/${name}`;
  return { url: url.toString(), drop: () => adminQuery(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`) };
}

/**
 * The real server on a temporary SQLite file, with the real local SMTP server. Under `npm run test:scale`
 * (DATABASE_URL=postgres://...) on a fresh PostgreSQL database instead, dropped at stop().
 */
export async function startTestApp(
  options: { seed?: 'demo' | 'none'; env?: Record<string, string>; signInLimits?: SignInLimits } = {},
): Promise<TestApp> {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'holdfire-test-'));
  const database = onPostgres && !options.env?.DATABASE_URL ? await createTestDatabase() : undefined;
  const holdfire = await startHoldfire(
    {
      HOLDFIRE_DATA_DIR: dataDir,
      DATABASE_URL: database?.url ?? `sqlite:${path.join(dataDir, 'holdfire.sqlite')}`,
      HOLDFIRE_SEED: options.seed ?? 'demo',
      NODE_ENV: 'test',
      APP_URL: 'http://holdfire.test',
      ...options.env,
    },
    { passwordCost: 4, signInLimits: options.signInLimits, log: () => {} },
  );
  const app = holdfire.app;

  async function client(email?: string, password = DEMO_PASSWORD): Promise<TestClient> {
    const agent = request.agent(app);
    const c: TestClient = {
      agent,
      csrf: '',
      async refreshCsrf() {
        const res = await agent.get('/api/auth/csrf').expect(200);
        c.csrf = res.body.csrfToken;
        return c.csrf;
      },
      post: (url, body = {}) => agent.post(url).set('X-CSRF-Token', c.csrf).send(body),
      patch: (url, body = {}) => agent.patch(url).set('X-CSRF-Token', c.csrf).send(body),
      get: (url) => agent.get(url),
    };
    await c.refreshCsrf();
    if (email) {
      await c.post('/api/auth/login', { email, password }).expect(200);
      await c.refreshCsrf();
    }
    return c;
  }

  return {
    holdfire,
    dataDir,
    client,
    async stop() {
      await holdfire.shutdown();
      await database?.drop();
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** Waits until the local SMTP server has stored a message for `to` (delivery is asynchronous). */
export async function waitForMail(admin: TestClient, to: string, timeoutMs = 5000, subject?: string | RegExp) {
  const until = Date.now() + timeoutMs;
  const matches = (s: string) => subject === undefined || (typeof subject === 'string' ? s === subject : subject.test(s));
  for (;;) {
    const res = await admin.get('/api/mail/outbox').expect(200);
    const found = (res.body as { to: string; subject: string; text: string }[]).find((m) => m.to.includes(to) && matches(m.subject));
    if (found) return found;
    if (Date.now() > until) throw new Error(`no mail for ${to} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 50));
  }
}
