import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import { jsonColumn } from './json-column';
import type { Team } from './team.model';

/** A position on the test day (propellants, pad, range...) that steps and polls name by its short code. */
export class Station extends Model<InferAttributes<Station>, InferCreationAttributes<Station>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare code: string;
  declare name: string;
  declare callSign: string;
  declare defaultPpe: string[];
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Station.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        code: { type: DataTypes.STRING(8), allowNull: false },
        name: { type: DataTypes.STRING(80), allowNull: false },
        callSign: { type: DataTypes.STRING(40), allowNull: false },
        defaultPpe: jsonColumn<string[]>('defaultPpe', []),
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'stations' },
    );
  }
}
