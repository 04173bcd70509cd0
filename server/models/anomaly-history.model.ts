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
import type { Anomaly } from './anomaly.model';
import type { User } from './user.model';

/** One change to an anomaly in words: who, when, what. Append-only. */
export class AnomalyHistory extends Model<InferAttributes<AnomalyHistory>, InferCreationAttributes<AnomalyHistory>> {
  declare id: CreationOptional<number>;
  declare anomalyId: ForeignKey<Anomaly['id']>;
  declare userId: ForeignKey<User['id']> | null;
  declare userName: string;
  declare text: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare anomaly?: NonAttribute<Anomaly>;

  static initModel(sequelize: Sequelize) {
    AnomalyHistory.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        userName: { type: DataTypes.STRING(120), allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'anomaly_history' },
    );
  }
}
