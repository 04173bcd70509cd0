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
import type { ActionStatus } from '../../src/contract/anomalies';
import type { Anomaly } from './anomaly.model';
import type { User } from './user.model';

/** What is to be done about an anomaly, by whom and by when. */
export class CorrectiveAction extends Model<InferAttributes<CorrectiveAction>, InferCreationAttributes<CorrectiveAction>> {
  declare id: CreationOptional<number>;
  declare anomalyId: ForeignKey<Anomaly['id']>;
  declare description: string;
  declare ownerId: ForeignKey<User['id']> | null;
  declare dueDate: string;
  declare status: CreationOptional<ActionStatus>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare owner?: NonAttribute<Pick<User, 'id' | 'name' | 'email'> | null>;

  static initModel(sequelize: Sequelize) {
    CorrectiveAction.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        description: { type: DataTypes.STRING(1000), allowNull: false },
        dueDate: { type: DataTypes.STRING(10), allowNull: false },
        status: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'open' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'corrective_actions' },
    );
  }
}
