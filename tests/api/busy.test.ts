import path from 'node:path';
import sqlite3 from 'sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../server/models';
import { createUser } from '../helpers/api';
import { onPostgres, startTestApp, type TestApp } from '../helpers/app';

let t: TestApp;
beforeAll(async () => {
  // A short busy timeout so the test need not wait out the real one.
  t = await startTestApp({ env: { HOLDFIRE_DB_BUSY_TIMEOUT_MS: '100' } });
});
afterAll(() => t.stop());

function run(db: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((resolve, reject) => db.run(sql, (error: Error | null) => (error ? reject(error) : resolve())));
}

// SQLite only: it holds the SQLite file's write lock from outside (SQLITE_BUSY); PostgreSQL has no such lock. Under npm run test:scale (PostgreSQL) it is skipped; npm run test:unit runs it.
describe.skipIf(onPostgres)('a database held by another writer for longer than the busy timeout', () => {
  it('answers 503 busy with Retry-After, saves nothing, and the same request works once the lock is free', async () => {
    const user = await createUser({ roles: ['operator'] });
    const c = await t.client(user.email, user.password);
    const other = await new Promise<sqlite3.Database>((resolve, reject) => {
      const db: sqlite3.Database = new sqlite3.Database(path.join(t.dataDir, 'holdfire.sqlite'), (error) => (error ? reject(error) : resolve(db)));
    });
    await run(other, 'BEGIN IMMEDIATE');
    let res;
    try {
      res = await c.patch('/api/profile', { name: 'Renamed While Locked' });
    } finally {
      await run(other, 'ROLLBACK');
      await new Promise<void>((resolve) => other.close(() => resolve()));
    }
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toBe('2');
    expect(res.body).toMatchObject({ code: 'busy', error: expect.stringMatching(/saved nothing/) });
    expect((await User.findByPk(user.id))!.name).not.toBe('Renamed While Locked');

    await c.patch('/api/profile', { name: 'Renamed While Locked' }).expect(200);
    expect((await User.findByPk(user.id))!.name).toBe('Renamed While Locked');
  });
});
