import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Hazard } from './hazard.model';
import { jsonColumn } from './json-column';
import type { User } from './user.model';

/** One changed field: who, when, before and after (JSON). Append-only. */
export class HazardHistory extends Model<InferAttributes<HazardHistory>, InferCreationAttributes<HazardHistory>> {
  declare id: CreationOptional<number>;
  declare hazardId: ForeignKey<Hazard['id']>;
  declare userId: ForeignKey<User['id']> | null;
  declare userName: string;
  declare field: string;
  declare before: unknown;
  declare after: unknown;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    HazardHistory.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        userName: { type: DataTypes.STRING(120), allowNull: false },
        field: { type: DataTypes.STRING(80), allowNull: false },
        before: { ...jsonColumn<unknown>('before', null), allowNull: true },
        after: { ...jsonColumn<unknown>('after', null), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'hazard_history' },
    );
  }
}
