import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  // One row per uploaded file of test data. The readings are stored as columns of little-endian float64 in one BLOB
  // (server/sensors/columns.ts), never a row per sample; the original file stays in uploads. Removing a dataset
  // removes this row and its upload and nothing of the count's log.
  await q.createTable('sensor_datasets', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    count_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'counts', key: 'id' }, onDelete: 'RESTRICT' },
    upload_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'uploads', key: 'id' }, onDelete: 'RESTRICT' },
    // 'seconds' (from T-0) or 'wallclock' (converted with the count's actual T-0 at upload).
    time_base: { type: DataTypes.STRING(12), allowNull: false },
    time_column: { type: DataTypes.STRING(80), allowNull: false },
    row_count: { type: DataTypes.INTEGER, allowNull: false },
    t_start: { type: DataTypes.DOUBLE, allowNull: false },
    t_end: { type: DataTypes.DOUBLE, allowNull: false },
    // JSON: [{ name, unit, low, high }], in column order after time.
    channels: { type: DataTypes.TEXT, allowNull: false },
    data: { type: DataTypes.BLOB, allowNull: false },
    created_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('sensor_datasets', ['count_id']);
  await q.addIndex('sensor_datasets', ['upload_id']);
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('sensor_datasets');
}
