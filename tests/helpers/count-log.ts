import { existsSync, readFileSync } from 'node:fs';
import type { Sequelize } from 'sequelize';
import { openDatabase } from '../../server/db';
import { migrate } from '../../server/db/migrator';
import { Count, initModels, Procedure, ProcedureRevision, Team, User } from '../../server/models';

/** A real SQLite file with every migration run and the models bound to it. */
export async function openCountDatabase(file: string): Promise<Sequelize> {
  const sequelize = await openDatabase({ sqliteStorage: file });
  initModels(sequelize);
  await migrate(sequelize);
  return sequelize;
}

/** A team, a test conductor, a released revision and a count of it, with nothing else around. */
export async function createCount(name = 'Kestrel-2 hot fire 1'): Promise<Count> {
  const team = (await Team.findOne()) ?? (await Team.create({ name: 'Tern Valley Rocketry Collective', site: 'Marsh End test site' }));
  const user =
    (await User.findOne()) ??
    (await User.create({ teamId: team.id, email: 'tc@tern-valley.test', name: 'Ines Okafor', passwordHash: 'not-a-hash', roles: ['conductor'] }));
  const procedure = await Procedure.create({ teamId: team.id, name: 'Kestrel-2 hot fire', stations: [] });
  const revision = await ProcedureRevision.create({
    procedureId: procedure.id,
    number: 1,
    status: 'released',
    basedOn: null,
    phases: [],
    releasedCautions: {},
    releasedAt: new Date(),
    createdById: user.id,
    updatedById: user.id,
  });
  return Count.create({ teamId: team.id, procedureId: procedure.id, revisionId: revision.id, name, windowEnd: null, createdById: user.id });
}

/**
 * Commits in the SQLite write-ahead log since it was last reset: frames whose "database size after commit"
 * field is non-zero and whose salts match the WAL header (older frames from before a reset carry other salts).
 * Layout from the SQLite file format documentation, section "WAL File Format". Checksums are not checked.
 */
export function walCommits(dbFile: string): number {
  const wal = `${dbFile}-wal`;
  if (!existsSync(wal)) return 0;
  const bytes = readFileSync(wal);
  if (bytes.length < 32) return 0;
  const pageSize = bytes.readUInt32BE(8);
  const salt1 = bytes.readUInt32BE(16);
  const salt2 = bytes.readUInt32BE(20);
  let commits = 0;
  for (let offset = 32; offset + 24 + pageSize <= bytes.length; offset += 24 + pageSize) {
    if (bytes.readUInt32BE(offset + 8) !== salt1 || bytes.readUInt32BE(offset + 12) !== salt2) break;
    if (bytes.readUInt32BE(offset + 4) !== 0) commits += 1;
  }
  return commits;
}
