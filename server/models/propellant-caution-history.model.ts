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
import type { User } from './user.model';

/** Every caution edit, before and after, append-only. */
export class PropellantCautionHistory extends Model<
  InferAttributes<PropellantCautionHistory>,
  InferCreationAttributes<PropellantCautionHistory>
> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare propellantId: string;
  declare userId: ForeignKey<User['id']> | null;
  declare userName: string;
  declare before: unknown;
  declare after: unknown;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    PropellantCautionHistory.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        propellantId: { type: DataTypes.STRING(40), allowNull: false },
        userName: { type: DataTypes.STRING(120), allowNull: false },
        before: { ...jsonColumn<unknown>('before', null), allowNull: true },
        after: { ...jsonColumn<unknown>('after', null), allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'propellant_caution_history' },
    );
  }
}
