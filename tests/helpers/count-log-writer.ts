/**
 * Child process for tests/api/count-log-crash.test.ts: appends to one count as fast as it can from a few
 * concurrent callers and prints `ack <seq> <hash>` for each event once append() has resolved, until killed.
 * Usage: node --import tsx tests/helpers/count-log-writer.ts <sqlite file> <count id>
 */
import { EventLog } from '../../server/counts/log';
import { openDatabase } from '../../server/db';
import { initModels } from '../../server/models';

const [file, countArg] = process.argv.slice(2);
const countId = Number(countArg);
const CALLERS = 4;
// A guard so a forgotten child cannot run on: the test kills it long before this.
const GIVE_UP_MS = 20_000;

const sequelize = await openDatabase({ sqliteStorage: file! });
initModels(sequelize);
const log = new EventLog({ sequelize });
setTimeout(() => process.exit(3), GIVE_UP_MS).unref();
process.stdout.write('ready\n');

await Promise.all(
  Array.from({ length: CALLERS }, async (_, caller) => {
    for (let i = 0; ; i += 1) {
      const events = await log.append(countId, [
        { type: 'station:answered', payload: { caller, i }, actor: { userId: null, name: `Station ${caller}` }, station: `S${caller}` },
      ]);
      // Writes to a pipe are synchronous on Linux: a printed ack is in the pipe before the next append starts.
      for (const e of events) process.stdout.write(`ack ${e.seq} ${e.hash}\n`);
    }
  }),
);
