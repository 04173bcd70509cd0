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
  await q.createTable('risk_matrices', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: team,
    key: { type: DataTypes.STRING(63), allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    definition: json('{}'),
    created_by_id: byUser,
    ...timestamps,
  });
  await q.addIndex('risk_matrices', ['team_id', 'key'], { unique: true });

  await q.createTable('hazards', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: team,
    // Per-team sequence behind the HZ-001 code; never reused.
    number: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    system: { type: DataTypes.STRING(40), allowNull: false },
    phase: { type: DataTypes.STRING(40), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    causes: json('[]'),
    effects: json('[]'),
    propellants: json('[]'),
    energies: json('[]'),
    matrix_id: { type: DataTypes.STRING(63), allowNull: false },
    initial_severity: { type: DataTypes.STRING(20), allowNull: false },
    initial_likelihood: { type: DataTypes.STRING(20), allowNull: false },
    residual_severity: { type: DataTypes.STRING(20), allowNull: true },
    residual_likelihood: { type: DataTypes.STRING(20), allowNull: true },
    status: { type: DataTypes.STRING(30), allowNull: false, defaultValue: 'open' },
    created_by_id: byUser,
    ...timestamps,
  });
  await q.addIndex('hazards', ['team_id', 'number'], { unique: true });

  await q.createTable('mitigations', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    hazard_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'hazards', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false },
    owner: { type: DataTypes.STRING(120), allowNull: false },
    verification_method: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    verification_status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'planned' },
    ...timestamps,
  });
  await q.addIndex('mitigations', ['hazard_id']);

  await q.createTable('mitigation_evidence', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    mitigation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'mitigations', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: DataTypes.STRING(10), allowNull: false },
    label: { type: DataTypes.STRING(200), allowNull: false },
    // Calc evidence: inputs, outputs and the date, frozen so a later library change cannot rewrite it.
    data: json('{}'),
    created_by_id: byUser,
    ...timestamps,
  });
  await q.addIndex('mitigation_evidence', ['mitigation_id']);

  await q.createTable('hazard_acceptances', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    hazard_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'hazards', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    user_name: { type: DataTypes.STRING(120), allowNull: false },
    role: { type: DataTypes.STRING(20), allowNull: false },
    // The residual level signed for: a signature does not carry over to a different risk.
    risk_level: { type: DataTypes.STRING(40), allowNull: false },
    ...timestamps,
  });
  await q.addIndex('hazard_acceptances', ['hazard_id', 'role'], { unique: true });

  await q.createTable('hazard_history', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    hazard_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: 'hazards', key: 'id' }, onDelete: 'CASCADE' },
    user_id: byUser,
    // Kept as text so the record still names the person if the account goes.
    user_name: { type: DataTypes.STRING(120), allowNull: false },
    field: { type: DataTypes.STRING(80), allowNull: false },
    before: { type: DataTypes.TEXT, allowNull: true },
    after: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await q.addIndex('hazard_history', ['hazard_id']);

  await q.createTable('propellant_caution_overrides', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: team,
    propellant_id: { type: DataTypes.STRING(40), allowNull: false },
    cautions: json('[]'),
    ppe: { type: DataTypes.TEXT, allowNull: true },
    updated_by_id: byUser,
    updated_by_name: { type: DataTypes.STRING(120), allowNull: false },
    ...timestamps,
  });
  await q.addIndex('propellant_caution_overrides', ['team_id', 'propellant_id'], { unique: true });

  await q.createTable('propellant_caution_history', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    team_id: team,
    propellant_id: { type: DataTypes.STRING(40), allowNull: false },
    user_id: byUser,
    user_name: { type: DataTypes.STRING(120), allowNull: false },
    before: { type: DataTypes.TEXT, allowNull: true },
    after: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await q.addIndex('propellant_caution_history', ['team_id', 'propellant_id']);
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  for (const table of [
    'propellant_caution_history',
    'propellant_caution_overrides',
    'hazard_history',
    'hazard_acceptances',
    'mitigation_evidence',
    'mitigations',
    'hazards',
    'risk_matrices',
  ]) {
    await q.dropTable(table);
  }
}
