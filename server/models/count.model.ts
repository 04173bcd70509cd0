import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { ProcedureRevision } from './procedure-revision.model';
import type { Procedure } from './procedure.model';
import type { Team } from './team.model';
import type { User } from './user.model';

/** One live count of a released procedure revision. Its events live in count_events (server/counts/log.ts). */
export class Count extends Model<InferAttributes<Count>, InferCreationAttributes<Count>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare procedureId: ForeignKey<Procedure['id']>;
  declare revisionId: ForeignKey<ProcedureRevision['id']>;
  declare name: string;
  /** The last known status, denormalised for lists; the event log is the source of truth. */
  declare status: CreationOptional<string>;
  /** End of the test window, epoch milliseconds. */
  declare windowEnd: number | null;
  /** When the crew is asked to report, epoch milliseconds. */
  declare reportAt: CreationOptional<number | null>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Count.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: { type: DataTypes.STRING(160), allowNull: false },
        status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'ready' },
        windowEnd: { type: DataTypes.INTEGER, allowNull: true },
        reportAt: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'counts' },
    );
  }
}
