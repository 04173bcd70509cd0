import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { EventLog } from '../../server/counts/log';
import { createCount, openCountDatabase } from '../helpers/count-log';

// An in-memory database exists only on Sequelize's one connection, so the log cannot open its own: it falls
// back to Sequelize's transactions there. (Its own file in tests/api: initModels binds the models to this database.)
let sequelize: Sequelize;
let log: EventLog;

beforeAll(async () => {
  sequelize = await openCountDatabase(':memory:');
  log = new EventLog({ sequelize });
});
afterAll(async () => {
  await log.close();
  await sequelize.close();
});

describe('EventLog on an in-memory database', () => {
  it('appends a gapless chain in groups, idempotently, and a failed group stores nothing', async () => {
    const count = await createCount();
    const tc = { userId: 1, name: 'Ines Okafor' };
    const acked = await Promise.all(
      Array.from({ length: 12 }, (_, k) => log.append(count.id, [{ type: 'station:answered', payload: { k }, actor: tc, station: 'TC', commandId: `c${k}` }])),
    );
    expect(acked.map(([e]) => e!.seq)).toEqual([...Array(12).keys()].map((k) => k + 1));
    expect(log.commits).toBeLessThan(12);
    const retry = await log.append(count.id, [{ type: 'other', payload: {}, actor: tc, station: 'TC', commandId: 'c3' }]);
    expect(retry).toEqual(acked[3]);
    await expect(log.append(999_999, [{ type: 'x', payload: {}, actor: null, station: null }])).rejects.toMatchObject({ code: 'count_not_found' });
    expect(await log.verify(count.id)).toEqual({ ok: true, count: 12 });
    expect((await log.settings()).journalMode).toBe('memory');
  });
});
