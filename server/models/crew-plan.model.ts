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
import type { CrewAssignment } from './crew-assignment.model';
import type { Procedure } from './procedure.model';
import type { Team } from './team.model';

/** Who stands at which station, for one procedure or one test day. */
export class CrewPlan extends Model<InferAttributes<CrewPlan>, InferCreationAttributes<CrewPlan>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare name: string;
  declare procedureId: ForeignKey<Procedure['id']> | null;
  /** YYYY-MM-DD, the local date of the test day. */
  declare testDate: string | null;
  declare notes: CreationOptional<string>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare assignments?: NonAttribute<CrewAssignment[]>;
  declare procedure?: NonAttribute<Procedure | null>;

  static initModel(sequelize: Sequelize) {
    CrewPlan.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        testDate: { type: DataTypes.STRING(10), allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'crew_plans' },
    );
  }
}
