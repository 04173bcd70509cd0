import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openPostgres } from '../../server/db';
import { EventLog } from '../../server/counts/log';
import { DEMO } from '../helpers/api';
import { onPostgres, startTestApp, type TestApp } from '../helpers/app';
import { demoRevision } from '../helpers/counts';

/**
 * The count log's PostgreSQL writer, with two EventLogs on two connection pools standing in for two processes:
 * appends racing under the per-count lock leave one gapless chain, epoch milliseconds come back as numbers, the
 * database refuses edits, and an edit made anyway is named by the server's check.
 */
let t: TestApp;
let other: Sequelize;
let otherLog: EventLog;

beforeAll(async () => {
  if (!onPostgres) return;
  t = await startTestApp();
  const config = t.holdfire.config;
  other = await openPostgres(config.databaseUrl);
  otherLog = new EventLog({ sequelize: other });
});
afterAll(async () => {
  if (!onPostgres) return;
  await otherLog.close();
  await other.close();
  await t.stop();
});

async function newCount(name: string): Promise<number> {
  const conductor = await t.client(DEMO.conductor);
  const rev = await demoRevision(conductor);
  return (await conductor.post('/api/counts', { ...rev, name }).expect(201)).body.id as number;
}

const note = (text: string) => ({ type: 'note:added', payload: { text }, actor: null, station: null });

describe.skipIf(!onPostgres)('the count log on PostgreSQL', () => {
  it('keeps one gapless chain when two logs (two processes) append to one count at once', async () => {
    const id = await newCount('Two writers');
    const mine = t.holdfire.eventLog;
    const before = (await mine.read(id)).length;
    const appends: Promise<unknown>[] = [];
    for (let i = 0; i < 15; i++) {
      appends.push(mine.append(id, [note(`A ${i}`)]));
      appends.push(otherLog.append(id, [note(`B ${i}`)]));
      // exclusive(): the decision sees what the other log appended since the seq it knew.
      appends.push(otherLog.exclusive(id, 0, (others) => [{ drafts: [note(`C ${i} after ${others.length}`)], commandId: null }]));
    }
    await Promise.all(appends);
    const events = await mine.read(id);
    expect(events).toHaveLength(before + 45);
    expect(events.map((e) => e.seq)).toEqual(events.map((_, i) => i + 1));
    expect(await mine.verify(id)).toMatchObject({ ok: true, count: before + 45 });
    // BIGINT epoch milliseconds read back as numbers, by Sequelize and by the log's own pool.
    expect(typeof events[0]!.at).toBe('number');
    const seen = await otherLog.exclusive(id, before + 44, (others) => {
      expect(others).toHaveLength(1);
      expect(typeof others[0]!.at).toBe('number');
      return [];
    });
    expect(seen.others[0]!.at).toBe(events.at(-1)!.at);
  });

  it('answers a retried commandId with the first events and stores nothing twice', async () => {
    const id = await newCount('Retried command');
    const first = await t.holdfire.eventLog.append(id, [{ ...note('once'), commandId: 'kestrel-cmd-1' }]);
    const again = await otherLog.append(id, [{ ...note('twice'), commandId: 'kestrel-cmd-1' }]);
    expect(again).toEqual(first);
    expect((await t.holdfire.eventLog.read(id)).filter((e) => e.commandId === 'kestrel-cmd-1')).toHaveLength(1);
  });

  it('refuses updates and deletes of events at the database; an edit made anyway is named by its seq', async () => {
    const id = await newCount('Tampered');
    await t.holdfire.eventLog.append(id, [note('first'), note('second')]);
    await expect(other.query(`UPDATE count_events SET payload = '{}' WHERE count_id = ${id} AND seq = 2`)).rejects.toThrow(/append-only/);
    await expect(other.query(`DELETE FROM count_events WHERE count_id = ${id}`)).rejects.toThrow(/append-only/);
    // The test cluster's owner may switch the trigger off: the hash chain still shows the edit.
    await other.query('ALTER TABLE count_events DISABLE TRIGGER count_events_append_only');
    try {
      await other.query(`UPDATE count_events SET payload = '{"text":"edited"}' WHERE count_id = ${id} AND seq = 2`);
    } finally {
      await other.query('ALTER TABLE count_events ENABLE TRIGGER count_events_append_only');
    }
    const auditor = await t.client(DEMO.auditor);
    const verdict = (await auditor.get(`/api/counts/${id}/verify`).expect(200)).body;
    expect(verdict).toMatchObject({ ok: false, seq: 2, reason: 'hash-mismatch' });
  });
});
