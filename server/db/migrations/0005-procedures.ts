import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};
const team = { type: DataTypes.INTEGER, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' };
const byUser = { type: DataTypes.INTEGER, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' };
// JSON lives in TEXT columns: SQLite has no JSON type Sequelize maps.
const json = (fallback: string) => ({ type: DataTypes.TEXT, allowNull: false, defaultValue: fallback });

export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('stations', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: team,
    // Steps name stations by this code, so a released revision stays readable on its own.
    code: { type: DataTypes.STRING(8), allowNull: false },
    name: { type: DataTypes.STRING(80), allowNull: false },
    call_sign: { type: DataTypes.STRING(40), allowNull: false },
    default_ppe: json('[]'),
    ...timestamps,
  });
  await q.addIndex('stations', ['team_id', 'code'], { unique: true });

  await q.createTable('procedures', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: team,
    name: { type: DataTypes.STRING(160), allowNull: false },
    purpose: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    test_article: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    site: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    stations: json('[]'),
    created_by_id: byUser,
    ...timestamps,
  });
  await q.addIndex('procedures', ['team_id']);

  await q.createTable('procedure_revisions', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    procedure_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'procedures', key: 'id' }, onDelete: 'CASCADE' },
    number: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'draft' },
    based_on: { type: DataTypes.INTEGER, allowNull: true },
    // Phases with their steps, in order; one document so a revision is saved and frozen as a whole.
    phases: json('[]'),
    // At release: each step's cautions as signed, by step key.
    released_cautions: { type: DataTypes.TEXT, allowNull: true },
    released_at: { type: DataTypes.DATE, allowNull: true },
    created_by_id: byUser,
    updated_by_id: byUser,
    ...timestamps,
  });
  await q.addIndex('procedure_revisions', ['procedure_id', 'number'], { unique: true });

  await q.createTable('procedure_signoffs', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'procedure_revisions', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    // Kept as text so the record still names the person if the account goes.
    user_name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(20), allowNull: false },
    ...timestamps,
  });
  await q.addIndex('procedure_signoffs', ['revision_id', 'role'], { unique: true });

  await q.createTable('crew_plans', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: team,
    name: { type: DataTypes.STRING(120), allowNull: false },
    procedure_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: 'procedures', key: 'id' }, onDelete: 'SET NULL' },
    test_date: { type: DataTypes.STRING(10), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    ...timestamps,
  });
  await q.addIndex('crew_plans', ['team_id']);

  await q.createTable('crew_assignments', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    crew_plan_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'crew_plans', key: 'id' }, onDelete: 'CASCADE' },
    station_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'stations', key: 'id' }, onDelete: 'RESTRICT' },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    ...timestamps,
  });
  await q.addIndex('crew_assignments', ['crew_plan_id', 'station_id', 'user_id'], { unique: true });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  for (const table of ['crew_assignments', 'crew_plans', 'procedure_signoffs', 'procedure_revisions', 'procedures', 'stations']) {
    await q.dropTable(table);
  }
}
