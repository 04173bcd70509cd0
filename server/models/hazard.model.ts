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
import type { HazardPhase, HazardSystem } from '../../src/contract/hazards';
import type { HazardStatus } from '../../src/domain/hazards/mitigation';
import type { PropellantId } from '../../src/domain/propellants/library';
import type { HazardAcceptance } from './hazard-acceptance.model';
import { jsonColumn } from './json-column';
import type { Mitigation } from './mitigation.model';
import type { Team } from './team.model';
import type { User } from './user.model';

export class Hazard extends Model<InferAttributes<Hazard>, InferCreationAttributes<Hazard>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare number: number;
  declare title: string;
  declare system: HazardSystem;
  declare phase: HazardPhase;
  declare description: CreationOptional<string>;
  declare causes: string[];
  declare effects: string[];
  declare propellants: PropellantId[];
  declare energies: string[];
  declare matrixId: string;
  declare initialSeverity: string;
  declare initialLikelihood: string;
  declare residualSeverity: string | null;
  declare residualLikelihood: string | null;
  declare status: CreationOptional<HazardStatus>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare mitigations?: NonAttribute<Mitigation[]>;
  declare acceptances?: NonAttribute<HazardAcceptance[]>;

  static initModel(sequelize: Sequelize) {
    Hazard.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        number: { type: DataTypes.INTEGER, allowNull: false },
        title: { type: DataTypes.STRING(200), allowNull: false },
        system: { type: DataTypes.STRING(40), allowNull: false },
        phase: { type: DataTypes.STRING(40), allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        causes: jsonColumn<string[]>('causes', []),
        effects: jsonColumn<string[]>('effects', []),
        propellants: jsonColumn<PropellantId[]>('propellants', []),
        energies: jsonColumn<string[]>('energies', []),
        matrixId: { type: DataTypes.STRING(63), allowNull: false },
        initialSeverity: { type: DataTypes.STRING(20), allowNull: false },
        initialLikelihood: { type: DataTypes.STRING(20), allowNull: false },
        residualSeverity: { type: DataTypes.STRING(20), allowNull: true },
        residualLikelihood: { type: DataTypes.STRING(20), allowNull: true },
        status: { type: DataTypes.STRING(30), allowNull: false, defaultValue: 'open' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'hazards' },
    );
  }
}
