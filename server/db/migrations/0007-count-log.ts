import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

export async function up({ queryInterface: q, sequelize }: MigrationContext): Promise<void> {
  await q.createTable('counts', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    // RESTRICT: a count's record must keep naming the procedure and the revision it ran.
    procedure_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'procedures', key: 'id' }, onDelete: 'RESTRICT' },
    revision_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'procedure_revisions', key: 'id' }, onDelete: 'RESTRICT' },
    name: { type: DataTypes.STRING(160), allowNull: false },
    // Denormalised from the event log for lists; the log stays the source of truth.
    status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'ready' },
    // Epoch milliseconds, like the events' times.
    window_end: { type: DataTypes.INTEGER, allowNull: true },
    created_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    ...timestamps,
  });
  await q.addIndex('counts', ['team_id']);

  await q.createTable('count_events', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    count_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'counts', key: 'id' }, onDelete: 'RESTRICT' },
    seq: { type: DataTypes.INTEGER, allowNull: false },
    type: { type: DataTypes.STRING(60), allowNull: false },
    // Canonical JSON text (src/domain/count/chain.ts).
    payload: { type: DataTypes.TEXT, allowNull: false },
    // Not a foreign key: a hashed row must keep the id it was written with, even if the account goes.
    actor_user_id: { type: DataTypes.INTEGER, allowNull: true },
    actor_name: { type: DataTypes.STRING(120), allowNull: true },
    station: { type: DataTypes.STRING(40), allowNull: true },
    // Epoch milliseconds, server time.
    at: { type: DataTypes.INTEGER, allowNull: false },
    command_id: { type: DataTypes.STRING(100), allowNull: true },
    prev_hash: { type: DataTypes.STRING(64), allowNull: false },
    hash: { type: DataTypes.STRING(64), allowNull: false },
  });
  await q.addIndex('count_events', ['count_id', 'seq'], { unique: true });
  // Not unique: one command may yield several events; the event log checks it inside its write transaction.
  await q.addIndex('count_events', ['count_id', 'command_id']);
  // The log is append-only: refuse edits and deletes at the database too (the hash chain still detects them).
  // These are SQLite's triggers; PostgreSQL gets its own in 0011-postgres.
  if (sequelize.getDialect() !== 'sqlite') return;
  await sequelize.query(
    `CREATE TRIGGER count_events_no_update BEFORE UPDATE ON count_events BEGIN SELECT RAISE(ABORT, 'count events are append-only'); END;`,
  );
  await sequelize.query(
    `CREATE TRIGGER count_events_no_delete BEFORE DELETE ON count_events BEGIN SELECT RAISE(ABORT, 'count events are append-only'); END;`,
  );
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('count_events');
  await q.dropTable('counts');
}
