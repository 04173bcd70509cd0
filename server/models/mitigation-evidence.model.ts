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
import type { EvidenceKind } from '../../src/contract/hazards';
import { jsonColumn } from './json-column';
import type { Mitigation } from './mitigation.model';
import type { Upload } from './upload.model';
import type { User } from './user.model';

export class MitigationEvidence extends Model<InferAttributes<MitigationEvidence>, InferCreationAttributes<MitigationEvidence>> {
  declare id: CreationOptional<number>;
  declare mitigationId: ForeignKey<Mitigation['id']>;
  declare kind: EvidenceKind;
  declare label: string;
  declare data: Record<string, unknown>;
  /** Kind 'file': the stored file. */
  declare uploadId: ForeignKey<Upload['id']> | null;
  declare upload?: NonAttribute<Upload | null>;
  declare createdBy?: NonAttribute<Pick<User, 'id' | 'name'> | null>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    MitigationEvidence.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        kind: { type: DataTypes.STRING(10), allowNull: false },
        label: { type: DataTypes.STRING(200), allowNull: false },
        data: jsonColumn<Record<string, unknown>>('data', {}),
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'mitigation_evidence' },
    );
  }
}
