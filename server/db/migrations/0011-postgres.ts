import type { MigrationContext } from '../migrator';

/** Epoch-millisecond columns: INTEGER is 64-bit on SQLite but 32-bit on PostgreSQL. */
const EPOCH_MS_COLUMNS = [
  ['count_events', 'at'],
  ['counts', 'window_end'],
  ['counts', 'report_at'],
  ['anomalies', 'at'],
] as const;

/**
 * What PostgreSQL needs that SQLite had from earlier migrations: 64-bit epoch milliseconds, and the count log's
 * append-only rule as a trigger in PostgreSQL's own language (0007 made SQLite's). Nothing happens on SQLite.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  if (sequelize.getDialect() !== 'postgres') return;
  for (const [table, column] of EPOCH_MS_COLUMNS) {
    await sequelize.query(`ALTER TABLE "${table}" ALTER COLUMN "${column}" TYPE BIGINT`);
  }
  await sequelize.query(`
    CREATE FUNCTION count_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'count events are append-only';
    END;
    $$`);
  await sequelize.query(
    `CREATE TRIGGER count_events_append_only BEFORE UPDATE OR DELETE ON count_events FOR EACH ROW EXECUTE FUNCTION count_events_append_only()`,
  );
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  if (sequelize.getDialect() !== 'postgres') return;
  await sequelize.query('DROP TRIGGER IF EXISTS count_events_append_only ON count_events');
  await sequelize.query('DROP FUNCTION IF EXISTS count_events_append_only()');
  for (const [table, column] of EPOCH_MS_COLUMNS) {
    await sequelize.query(`ALTER TABLE "${table}" ALTER COLUMN "${column}" TYPE INTEGER`);
  }
}
