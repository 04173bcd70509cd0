import request from 'supertest';
import { hashPassword } from '../../server/auth/passwords';
import { Team, User } from '../../server/models';
import type { Role } from '../../src/domain/people/roles';
import type { TestApp, TestClient } from './app';

export const DEMO = {
  admin: 'admin@ternvalley.test',
  conductor: 'conductor@ternvalley.test',
  safety: 'safety@ternvalley.test',
  propellants: 'propellants@ternvalley.test',
  pad: 'pad@ternvalley.test',
  range: 'range@ternvalley.test',
  data: 'data@ternvalley.test',
  auditor: 'auditor@ternvalley.test',
} as const;

let counter = 0;
/** A fresh address per call, so tests that create people do not depend on each other. */
export function uniqueEmail(prefix = 'person'): string {
  counter += 1;
  return `${prefix}-${process.pid}-${Date.now().toString(36)}-${counter}@example.test`;
}

/** The `holdfire.sid=...` pair from a response's Set-Cookie, or undefined when none was set. */
export function sessionCookie(res: { headers: Record<string, unknown> }): string | undefined {
  const raw = res.headers['set-cookie'];
  const list = Array.isArray(raw) ? (raw as string[]) : typeof raw === 'string' ? [raw] : [];
  const line = list.find((c) => c.startsWith('holdfire.sid='));
  return line?.split(';')[0];
}

/** The full Set-Cookie line for the session cookie (flags included). */
export function sessionCookieLine(res: { headers: Record<string, unknown> }): string | undefined {
  const raw = res.headers['set-cookie'];
  const list = Array.isArray(raw) ? (raw as string[]) : typeof raw === 'string' ? [raw] : [];
  return list.find((c) => c.startsWith('holdfire.sid='));
}

/** Signs in with a fresh client and also returns the session cookie the login set. */
export async function signInWithCookie(
  t: TestApp,
  email: string,
  password = 'kestrel-demo',
): Promise<{ client: TestClient; cookie: string }> {
  const client = await t.client();
  const res = await client.post('/api/auth/login', { email, password }).expect(200);
  const cookie = sessionCookie(res);
  if (!cookie) throw new Error('login set no session cookie');
  await client.refreshCsrf();
  return { client, cookie };
}

/** A raw request carrying only the given cookie (no agent jar), to check what a cookie value alone grants. */
export function withCookie(t: TestApp, cookie: string) {
  return {
    get: (url: string) => request(t.holdfire.app).get(url).set('Cookie', cookie),
  };
}

/** Creates a person straight in the database (cheap bcrypt cost), in the demo team. */
export async function createUser(options: {
  email?: string;
  name?: string;
  roles?: Role[];
  password?: string;
  active?: boolean;
}): Promise<{ id: number; email: string; password: string }> {
  const team = await Team.findOne({ order: [['id', 'ASC']] });
  if (!team) throw new Error('no team to add a user to');
  const email = options.email ?? uniqueEmail();
  const password = options.password ?? 'correct-horse-battery';
  const user = await User.create({
    teamId: team.id,
    email,
    name: options.name ?? 'Test Person',
    passwordHash: await hashPassword(password, 4),
    roles: options.roles ?? ['operator'],
    active: options.active ?? true,
  });
  return { id: user.id, email, password };
}

export interface OutboxMessage {
  id: number;
  to: string;
  subject: string;
  text: string;
  sentAt: string;
}

export async function outbox(admin: TestClient): Promise<OutboxMessage[]> {
  const res = await admin.get('/api/mail/outbox').expect(200);
  return res.body as OutboxMessage[];
}

export async function mailsTo(admin: TestClient, to: string): Promise<OutboxMessage[]> {
  return (await outbox(admin)).filter((m) => m.to === to);
}

/** Waits until at least `count` messages for `to` are in the outbox; returns them newest first. */
export async function waitForMails(admin: TestClient, to: string, count = 1, timeoutMs = 5000): Promise<OutboxMessage[]> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = await mailsTo(admin, to);
    if (found.length >= count) return found;
    if (Date.now() > until) throw new Error(`expected ${count} mail(s) for ${to} within ${timeoutMs} ms, got ${found.length}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** The token from a mailed link such as http://holdfire.test/invite/<token>. */
export function tokenFromLink(text: string, kind: 'invite' | 'reset-password'): string {
  const match = new RegExp(`http://holdfire\\.test/${kind}/([A-Za-z0-9_-]+)`).exec(text);
  if (!match) throw new Error(`no ${kind} link in mail:\n${text}`);
  return match[1]!;
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
