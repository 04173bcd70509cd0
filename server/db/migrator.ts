import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import * as m0001 from './migrations/0001-foundation';
import * as m0002 from './migrations/0002-hazards';
import * as m0003 from './migrations/0003-uploads';
import * as m0004 from './migrations/0004-risk-matrix-lifecycle';
import * as m0005 from './migrations/0005-procedures';
import * as m0006 from './migrations/0006-procedure-attachments';
import * as m0007 from './migrations/0007-count-log';
import * as m0008 from './migrations/0008-sensor-data';
import * as m0009 from './migrations/0009-anomalies';
import * as m0010 from './migrations/0010-notifications';
import * as m0011 from './migrations/0011-postgres';
import * as m0013 from './migrations/0013-count-events-no-replace';

export interface MigrationContext {
  queryInterface: QueryInterface;
  sequelize: Sequelize;
}

/** Migrations are listed here in order; a new one is a file in ./migrations plus one line below. */
const MIGRATIONS = [
  { name: '0001-foundation', ...m0001 },
  { name: '0002-hazards', ...m0002 },
  { name: '0003-uploads', ...m0003 },
  { name: '0004-risk-matrix-lifecycle', ...m0004 },
  { name: '0005-procedures', ...m0005 },
  { name: '0006-procedure-attachments', ...m0006 },
  { name: '0007-count-log', ...m0007 },
  { name: '0008-sensor-data', ...m0008 },
  { name: '0009-anomalies', ...m0009 },
  { name: '0010-notifications', ...m0010 },
  { name: '0011-postgres', ...m0011 },
  { name: '0013-count-events-no-replace', ...m0013 },
];

export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: MIGRATIONS.map(({ name, up, down }) => ({
      name,
      up: ({ context }) => up(context),
      down: ({ context }) => down(context),
    })),
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

export async function migrate(sequelize: Sequelize): Promise<void> {
  await createMigrator(sequelize).up();
}
