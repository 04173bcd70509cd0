import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Team } from './team.model';
import type { User } from './user.model';

/** One stored file of a team. The bytes are on disk under a random name (see server/uploads). */
export class Upload extends Model<InferAttributes<Upload>, InferCreationAttributes<Upload>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare storedName: string;
  declare originalName: string;
  declare mediaType: string;
  declare sizeBytes: number;
  declare sha256: string;
  declare uploadedById: ForeignKey<User['id']> | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Upload.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        storedName: { type: DataTypes.STRING(80), allowNull: false, unique: true },
        originalName: { type: DataTypes.STRING(200), allowNull: false },
        mediaType: { type: DataTypes.STRING(100), allowNull: false },
        sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
        sha256: { type: DataTypes.STRING(64), allowNull: false },
        createdAt: DataTypes.DATE,
      },
      // A file never changes once stored: no updated_at.
      { sequelize, tableName: 'uploads', updatedAt: false },
    );
  }
}
