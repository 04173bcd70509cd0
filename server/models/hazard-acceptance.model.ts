import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Role } from '../../src/domain/people/roles';
import type { Hazard } from './hazard.model';
import type { User } from './user.model';

export class HazardAcceptance extends Model<InferAttributes<HazardAcceptance>, InferCreationAttributes<HazardAcceptance>> {
  declare id: CreationOptional<number>;
  declare hazardId: ForeignKey<Hazard['id']>;
  declare userId: ForeignKey<User['id']>;
  declare userName: string;
  declare role: Role;
  declare riskLevel: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    HazardAcceptance.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        userName: { type: DataTypes.STRING(120), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        riskLevel: { type: DataTypes.STRING(40), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'hazard_acceptances' },
    );
  }
}
