import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import * as m0001 from './migrations/0001-foundation';
import * as m0002 from './migrations/0002-hazards';
import * as m0004 from './migrations/0004-procedures';

export interface MigrationContext {
  queryInterface: QueryInterface;
  sequelize: Sequelize;
}

/** Migrations are listed here in order; a new one is a file in ./migrations plus one line below. */
const MIGRATIONS = [
  { name: '0001-foundation', ...m0001 },
  { name: '0002-hazards', ...m0002 },
  { name: '0004-procedures', ...m0004 },
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
