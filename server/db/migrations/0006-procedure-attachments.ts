import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  // Diagrams and photos belong to a revision, so what was released keeps the files it was signed with. A new
  // draft copies the links (the same uploads); a file is deleted only when no revision links to it any more.
  await q.createTable('procedure_attachments', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'procedure_revisions', key: 'id' }, onDelete: 'CASCADE' },
    // The step's stable key, or null for the whole procedure.
    step_key: { type: DataTypes.STRING(40), allowNull: true },
    upload_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'uploads', key: 'id' }, onDelete: 'RESTRICT' },
    caption: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
    created_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('procedure_attachments', ['revision_id']);
  await q.addIndex('procedure_attachments', ['upload_id']);
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('procedure_attachments');
}
