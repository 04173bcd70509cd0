import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { AcceptanceMap } from '../../src/domain/hazards/acceptance';
import type { RiskMatrix as RiskMatrixDef } from '../../src/domain/hazards/matrix';
import { jsonColumn } from './json-column';
import type { Team } from './team.model';
import type { User } from './user.model';

export type StoredMatrixDefinition = Omit<RiskMatrixDef, 'id' | 'name'> & { acceptanceMap: AcceptanceMap };

/** A team-defined risk matrix; the built-in MIL-STD-882E matrix lives in the domain, not here. */
export class RiskMatrix extends Model<InferAttributes<RiskMatrix>, InferCreationAttributes<RiskMatrix>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare key: string;
  declare name: string;
  declare definition: StoredMatrixDefinition;
  declare createdById: ForeignKey<User['id']> | null;
  declare retiredAt: CreationOptional<Date | null>;
  declare isDefault: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    RiskMatrix.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        key: { type: DataTypes.STRING(63), allowNull: false },
        name: { type: DataTypes.STRING(120), allowNull: false },
        definition: jsonColumn<StoredMatrixDefinition>('definition', {
          severities: [],
          likelihoods: [],
          levels: [],
          cells: {},
          acceptanceMap: {},
        }),
        retiredAt: { type: DataTypes.DATE, allowNull: true },
        isDefault: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'risk_matrices' },
    );
  }
}
