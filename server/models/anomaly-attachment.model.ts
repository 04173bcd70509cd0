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
import type { Upload } from './upload.model';
import type { User } from './user.model';

/** A photo or file on an anomaly report. */
export class AnomalyAttachment extends Model<InferAttributes<AnomalyAttachment>, InferCreationAttributes<AnomalyAttachment>> {
  declare id: CreationOptional<number>;
  declare anomalyId: ForeignKey<Anomaly['id']>;
  declare uploadId: ForeignKey<Upload['id']>;
  declare caption: CreationOptional<string>;
  declare createdById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  declare upload?: NonAttribute<Upload>;
  declare createdBy?: NonAttribute<Pick<User, 'id' | 'name'> | null>;

  static initModel(sequelize: Sequelize) {
    AnomalyAttachment.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        caption: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'anomaly_attachments' },
    );
  }
}
