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
import type { AnomalyStatus } from '../../src/contract/anomalies';
import type { AnomalyAttachment } from './anomaly-attachment.model';
import type { AnomalyHistory } from './anomaly-history.model';
import type { AnomalyRevision } from './anomaly-revision.model';
import type { Count } from './count.model';
import type { CorrectiveAction } from './corrective-action.model';
import type { Hazard } from './hazard.model';
import type { Team } from './team.model';
import type { User } from './user.model';

/** Something that went wrong at an instant of a count, or found outside one. */
export class Anomaly extends Model<InferAttributes<Anomaly>, InferCreationAttributes<Anomaly>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare number: number;
  declare title: string;
  declare description: string;
  declare immediateActions: CreationOptional<string>;
  declare matrixId: string;
  declare severity: string;
  declare countId: ForeignKey<Count['id']> | null;
  declare at: number;
  declare tSeconds: number | null;
  declare countStatus: string | null;
  declare status: CreationOptional<AnomalyStatus>;
  declare reportedById: ForeignKey<User['id']> | null;
  declare closedAt: Date | null;
  declare closedById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare count?: NonAttribute<Count | null>;
  declare hazards?: NonAttribute<Hazard[]>;
  declare attachments?: NonAttribute<AnomalyAttachment[]>;
  declare actions?: NonAttribute<CorrectiveAction[]>;
  declare history?: NonAttribute<AnomalyHistory[]>;
  declare revisionLinks?: NonAttribute<AnomalyRevision[]>;
  declare reportedBy?: NonAttribute<Pick<User, 'id' | 'name'> | null>;
  declare closedBy?: NonAttribute<Pick<User, 'id' | 'name'> | null>;

  static initModel(sequelize: Sequelize) {
    Anomaly.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        number: { type: DataTypes.INTEGER, allowNull: false },
        title: { type: DataTypes.STRING(200), allowNull: false },
        description: { type: DataTypes.TEXT, allowNull: false },
        immediateActions: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        matrixId: { type: DataTypes.STRING(63), allowNull: false },
        severity: { type: DataTypes.STRING(20), allowNull: false },
        at: { type: DataTypes.INTEGER, allowNull: false },
        tSeconds: { type: DataTypes.FLOAT, allowNull: true },
        countStatus: { type: DataTypes.STRING(20), allowNull: true },
        status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'open' },
        closedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'anomalies' },
    );
  }
}
