import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  // Files people upload (evidence photos, reports; later procedure attachments). The bytes live under
  // <HOLDFIRE_DATA_DIR>/uploads/<stored_name>; stored_name is random, never the name the file came with.
  await q.createTable('uploads', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    stored_name: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    original_name: { type: DataTypes.STRING(200), allowNull: false },
    // Decided from the bytes, not from the name or the browser's claim.
    media_type: { type: DataTypes.STRING(100), allowNull: false },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    uploaded_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.addIndex('uploads', ['team_id']);

  // File evidence points at its upload; an upload still used as evidence cannot be deleted.
  await q.addColumn('mitigation_evidence', 'upload_id', {
    type: DataTypes.INTEGER,
    allowNull: true,
    references: { model: 'uploads', key: 'id' },
    onDelete: 'RESTRICT',
  });
  await q.addIndex('mitigation_evidence', ['upload_id']);
}

export async function down({ queryInterface: q, sequelize }: MigrationContext): Promise<void> {
  // SQLite cannot drop a column that has a foreign key, and Sequelize's removeColumn rebuilds the table
  // without its ON DELETE rules: rebuild it by hand exactly as 0002 made it.
  await q.createTable('mitigation_evidence_0002', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    mitigation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'mitigations', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(10), allowNull: false },
    label: { type: DataTypes.STRING(200), allowNull: false },
    data: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' },
    created_by_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  // File evidence cannot exist without the uploads table: it goes with it.
  await sequelize.query(
    `INSERT INTO mitigation_evidence_0002 (id, mitigation_id, kind, label, data, created_by_id, created_at, updated_at)
     SELECT id, mitigation_id, kind, label, data, created_by_id, created_at, updated_at FROM mitigation_evidence WHERE upload_id IS NULL`,
  );
  await q.dropTable('mitigation_evidence');
  await q.renameTable('mitigation_evidence_0002', 'mitigation_evidence');
  await q.addIndex('mitigation_evidence', ['mitigation_id']);
  await q.dropTable('uploads');
}
