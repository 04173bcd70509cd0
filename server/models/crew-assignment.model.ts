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
import type { CrewPlan } from './crew-plan.model';
import type { Station } from './station.model';
import type { User } from './user.model';

export class CrewAssignment extends Model<InferAttributes<CrewAssignment>, InferCreationAttributes<CrewAssignment>> {
  declare id: CreationOptional<number>;
  declare crewPlanId: ForeignKey<CrewPlan['id']>;
  declare stationId: ForeignKey<Station['id']>;
  declare userId: ForeignKey<User['id']>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare station?: NonAttribute<Station>;
  declare user?: NonAttribute<User>;

  static initModel(sequelize: Sequelize) {
    CrewAssignment.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'crew_assignments' },
    );
  }
}
