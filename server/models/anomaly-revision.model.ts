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
import type { ProcedureRevision } from './procedure-revision.model';
import type { User } from './user.model';

/** Lessons learned: a procedure revision drafted (or already open and linked) because of an anomaly. */
export class AnomalyRevision extends Model<InferAttributes<AnomalyRevision>, InferCreationAttributes<AnomalyRevision>> {
  declare anomalyId: ForeignKey<Anomaly['id']>;
  declare revisionId: ForeignKey<ProcedureRevision['id']>;
  declare drafted: boolean;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare revision?: NonAttribute<ProcedureRevision>;
  declare anomaly?: NonAttribute<Anomaly>;

  static initModel(sequelize: Sequelize) {
    AnomalyRevision.init(
      {
        anomalyId: { type: DataTypes.INTEGER, primaryKey: true },
        revisionId: { type: DataTypes.INTEGER, primaryKey: true },
        drafted: { type: DataTypes.BOOLEAN, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'anomaly_revisions' },
    );
  }
}
