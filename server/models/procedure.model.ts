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
import { jsonColumn } from './json-column';
import type { ProcedureRevision } from './procedure-revision.model';
import type { Team } from './team.model';
import type { User } from './user.model';

export class Procedure extends Model<InferAttributes<Procedure>, InferCreationAttributes<Procedure>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare name: string;
  declare purpose: CreationOptional<string>;
  declare testArticle: CreationOptional<string>;
  declare site: CreationOptional<string>;
  /** Station codes involved beyond those the steps name. */
  declare stations: string[];
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare revisions?: NonAttribute<ProcedureRevision[]>;

  static initModel(sequelize: Sequelize) {
    Procedure.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        purpose: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        testArticle: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
        site: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
        stations: jsonColumn<string[]>('stations', []),
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'procedures' },
    );
  }
}
