import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const userRef = { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' };

export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('anomalies', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    // AN-001, per team.
    number: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false },
    immediate_actions: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    // A severity key of the matrix named beside it (the team's default when reported).
    matrix_id: { type: DataTypes.STRING(63), allowNull: false },
    severity: { type: DataTypes.STRING(20), allowNull: false },
    // RESTRICT: a count's record keeps the anomalies reported against it.
    count_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'counts', key: 'id' }, onDelete: 'RESTRICT' },
    // Epoch milliseconds, like the count log's times.
    at: { type: DataTypes.INTEGER, allowNull: false },
    // Computed from the count's log when reported; the log stays the source of truth.
    t_seconds: { type: DataTypes.FLOAT, allowNull: true },
    count_status: { type: DataTypes.STRING(20), allowNull: true },
    status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'open' },
    reported_by_id: userRef,
    closed_at: { type: DataTypes.DATE, allowNull: true },
    closed_by_id: userRef,
    ...timestamps,
  });
  await q.addIndex('anomalies', ['team_id', 'number'], { unique: true });
  await q.addIndex('anomalies', ['count_id']);

  await q.createTable('anomaly_hazards', {
    anomaly_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'anomalies', key: 'id' }, onDelete: 'CASCADE' },
    hazard_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'hazards', key: 'id' }, onDelete: 'CASCADE' },
    created_by_id: userRef,
    ...timestamps,
  });
  await q.addIndex('anomaly_hazards', ['hazard_id']);

  await q.createTable('anomaly_attachments', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    anomaly_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'anomalies', key: 'id' }, onDelete: 'CASCADE' },
    upload_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'uploads', key: 'id' }, onDelete: 'RESTRICT' },
    caption: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
    created_by_id: userRef,
    ...timestamps,
  });
  await q.addIndex('anomaly_attachments', ['anomaly_id']);
  await q.addIndex('anomaly_attachments', ['upload_id']);

  await q.createTable('corrective_actions', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    anomaly_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'anomalies', key: 'id' }, onDelete: 'CASCADE' },
    description: { type: DataTypes.STRING(1000), allowNull: false },
    owner_id: userRef,
    // YYYY-MM-DD: a day, not an instant.
    due_date: { type: DataTypes.STRING(10), allowNull: false },
    status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'open' },
    ...timestamps,
  });
  await q.addIndex('corrective_actions', ['anomaly_id']);

  await q.createTable('anomaly_history', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    anomaly_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'anomalies', key: 'id' }, onDelete: 'CASCADE' },
    user_id: userRef,
    user_name: { type: DataTypes.STRING(120), allowNull: false },
    // The change in words, written when it happened (names as they were then).
    text: { type: DataTypes.TEXT, allowNull: false },
    ...timestamps,
  });
  await q.addIndex('anomaly_history', ['anomaly_id']);

  // Lessons learned: the procedure revisions opened (or already open and linked) because of an anomaly.
  await q.createTable('anomaly_revisions', {
    anomaly_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'anomalies', key: 'id' }, onDelete: 'CASCADE' },
    revision_id: { type: DataTypes.INTEGER, primaryKey: true, references: { model: 'procedure_revisions', key: 'id' }, onDelete: 'CASCADE' },
    drafted: { type: DataTypes.BOOLEAN, allowNull: false },
    created_by_id: userRef,
    ...timestamps,
  });
  await q.addIndex('anomaly_revisions', ['revision_id']);
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  for (const table of ['anomaly_revisions', 'anomaly_history', 'corrective_actions', 'anomaly_attachments', 'anomaly_hazards', 'anomalies']) {
    await q.dropTable(table);
  }
}
