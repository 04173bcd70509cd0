import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrator';

/**
 * A team matrix can be retired (kept for the hazards assessed with it, offered for no new one) and one
 * team matrix can be the team's default for new hazards; no row marked means the built-in matrix.
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.addColumn('risk_matrices', 'retired_at', { type: DataTypes.DATE, allowNull: true });
  await q.addColumn('risk_matrices', 'is_default', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.removeColumn('risk_matrices', 'is_default');
  await q.removeColumn('risk_matrices', 'retired_at');
}
