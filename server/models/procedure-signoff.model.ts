import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { SignoffRole } from '../../src/domain/procedures/release';
import type { ProcedureRevision } from './procedure-revision.model';
import type { User } from './user.model';

export class ProcedureSignoff extends Model<InferAttributes<ProcedureSignoff>, InferCreationAttributes<ProcedureSignoff>> {
  declare id: CreationOptional<number>;
  declare revisionId: ForeignKey<ProcedureRevision['id']>;
  declare userId: ForeignKey<User['id']>;
  declare userName: string;
  declare role: SignoffRole;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ProcedureSignoff.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        userName: { type: DataTypes.STRING(120), allowNull: false },
        role: { type: DataTypes.STRING(20), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'procedure_signoffs' },
    );
  }
}
