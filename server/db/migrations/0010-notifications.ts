import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  // JSON: { [kind]: 'immediate' | 'digest' | 'off' }; null means every notice at once.
  await q.addColumn('users', 'notification_prefs', { type: DataTypes.TEXT, allowNull: true });
  // When the crew is asked to report for a count, epoch milliseconds like the count's other times.
  await q.addColumn('counts', 'report_at', { type: DataTypes.INTEGER, allowNull: true });
  await q.createTable('notification_digest_items', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    subject: { type: DataTypes.STRING(300), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('notification_digest_items', ['user_id', 'sent_at']);
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('notification_digest_items');
  await q.removeColumn('counts', 'report_at');
  await q.removeColumn('users', 'notification_prefs');
}
