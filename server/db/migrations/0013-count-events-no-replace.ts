import type { MigrationContext } from '../migrator';

/**
 * SQLite runs no delete trigger for the rows an INSERT OR REPLACE removes (recursive triggers are off), so
 * `REPLACE INTO count_events` with a stored id or (count, seq) would rewrite an event past the append-only
 * triggers of 0007. An insert may only add a new row: one that would collide is refused before it can replace.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  if (sequelize.getDialect() !== 'sqlite') return;
  await sequelize.query(
    `CREATE TRIGGER count_events_no_replace BEFORE INSERT ON count_events
     WHEN EXISTS (SELECT 1 FROM count_events WHERE id = NEW.id OR (count_id = NEW.count_id AND seq = NEW.seq))
     BEGIN SELECT RAISE(ABORT, 'count events are append-only'); END;`,
  );
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  if (sequelize.getDialect() !== 'sqlite') return;
  await sequelize.query('DROP TRIGGER IF EXISTS count_events_no_replace');
}
