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
import type { ProcedureRevision } from './procedure-revision.model';
import type { Upload } from './upload.model';
import type { User } from './user.model';

/** A diagram or photo on a revision, for the whole procedure (stepKey null) or for one step. */
export class ProcedureAttachment extends Model<InferAttributes<ProcedureAttachment>, InferCreationAttributes<ProcedureAttachment>> {
  declare id: CreationOptional<number>;
  declare revisionId: ForeignKey<ProcedureRevision['id']>;
  declare stepKey: string | null;
  declare uploadId: ForeignKey<Upload['id']>;
  declare caption: CreationOptional<string>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare upload?: NonAttribute<Upload>;
  declare createdBy?: NonAttribute<Pick<User, 'id' | 'name'> | null>;

  static initModel(sequelize: Sequelize) {
    ProcedureAttachment.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        stepKey: { type: DataTypes.STRING(40), allowNull: true },
        caption: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'procedure_attachments' },
    );
  }
}
