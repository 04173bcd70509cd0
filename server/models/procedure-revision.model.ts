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
import type { ResolvedCaution } from '../../src/domain/procedures/cautions';
import type { RevisionStatus } from '../../src/domain/procedures/release';
import type { Phase } from '../../src/domain/procedures/steps';
import { jsonColumn } from './json-column';
import type { ProcedureAttachment } from './procedure-attachment.model';
import type { ProcedureSignoff } from './procedure-signoff.model';
import type { Procedure } from './procedure.model';
import type { User } from './user.model';

export class ProcedureRevision extends Model<InferAttributes<ProcedureRevision>, InferCreationAttributes<ProcedureRevision>> {
  declare id: CreationOptional<number>;
  declare procedureId: ForeignKey<Procedure['id']>;
  declare number: number;
  declare status: CreationOptional<RevisionStatus>;
  declare basedOn: number | null;
  declare phases: Phase[];
  /** Step key -> the cautions as they stood when the revision was released. */
  declare releasedCautions: Record<string, ResolvedCaution[]> | null;
  declare releasedAt: Date | null;
  declare createdById: ForeignKey<User['id']> | null;
  declare updatedById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare signoffs?: NonAttribute<ProcedureSignoff[]>;
  declare attachments?: NonAttribute<ProcedureAttachment[]>;

  static initModel(sequelize: Sequelize) {
    ProcedureRevision.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        number: { type: DataTypes.INTEGER, allowNull: false },
        status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'draft' },
        basedOn: { type: DataTypes.INTEGER, allowNull: true },
        phases: jsonColumn<Phase[]>('phases', []),
        releasedCautions: { ...jsonColumn<Record<string, ResolvedCaution[]> | null>('releasedCautions', null), allowNull: true },
        releasedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'procedure_revisions' },
    );
  }
}
