import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { HandlingCaution, PpeItem } from '../../src/domain/propellants/library';
import { jsonColumn } from './json-column';
import type { Team } from './team.model';
import type { User } from './user.model';

/** A team's edited cautions for one library propellant; the library itself stays untouched. */
export class PropellantCautionOverride extends Model<
  InferAttributes<PropellantCautionOverride>,
  InferCreationAttributes<PropellantCautionOverride>
> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare propellantId: string;
  /** Rows written before sources were kept may lack `source`, and their PPE may be plain strings. */
  declare cautions: HandlingCaution[];
  declare ppe: (PpeItem | string)[] | null;
  declare updatedById: ForeignKey<User['id']> | null;
  declare updatedByName: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    PropellantCautionOverride.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        propellantId: { type: DataTypes.STRING(40), allowNull: false },
        cautions: jsonColumn<HandlingCaution[]>('cautions', []),
        ppe: { ...jsonColumn<(PpeItem | string)[] | null>('ppe', null), allowNull: true },
        updatedByName: { type: DataTypes.STRING(120), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'propellant_caution_overrides' },
    );
  }
}
