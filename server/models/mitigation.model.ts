import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Sequelize,
} from 'sequelize';
import type { VerificationStatus } from '../../src/contract/hazards';
import type { MitigationKind } from '../../src/domain/hazards/mitigation';
import type { Hazard } from './hazard.model';
import type { MitigationEvidence } from './mitigation-evidence.model';

export class Mitigation extends Model<InferAttributes<Mitigation>, InferCreationAttributes<Mitigation>> {
  declare id: CreationOptional<number>;
  declare hazardId: ForeignKey<Hazard['id']>;
  declare kind: MitigationKind;
  declare description: string;
  declare owner: string;
  declare verificationMethod: CreationOptional<string>;
  declare verificationStatus: CreationOptional<VerificationStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare evidence?: NonAttribute<MitigationEvidence[]>;

  static initModel(sequelize: Sequelize) {
    Mitigation.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false },
        owner: { type: DataTypes.STRING(120), allowNull: false },
        verificationMethod: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        verificationStatus: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'planned' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'mitigations' },
    );
  }
}
