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
import type { Hazard } from './hazard.model';
import type { User } from './user.model';

/** An anomaly linked to a hazard of the register. */
export class AnomalyHazard extends Model<InferAttributes<AnomalyHazard>, InferCreationAttributes<AnomalyHazard>> {
  declare anomalyId: ForeignKey<Anomaly['id']>;
  declare hazardId: ForeignKey<Hazard['id']>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare hazard?: NonAttribute<Hazard>;

  static initModel(sequelize: Sequelize) {
    AnomalyHazard.init(
      {
        anomalyId: { type: DataTypes.INTEGER, primaryKey: true },
        hazardId: { type: DataTypes.INTEGER, primaryKey: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'anomaly_hazards' },
    );
  }
}
