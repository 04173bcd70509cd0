import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { User } from './user.model';

/** A notice kept for someone's next daily digest (server/mail/notify.ts); `sentAt` once it went out. */
export class NotificationDigestItem extends Model<InferAttributes<NotificationDigestItem>, InferCreationAttributes<NotificationDigestItem>> {
  declare id: CreationOptional<number>;
  declare userId: ForeignKey<User['id']>;
  declare kind: string;
  declare subject: string;
  declare body: string;
  declare sentAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    NotificationDigestItem.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        kind: { type: DataTypes.STRING(40), allowNull: false },
        subject: { type: DataTypes.STRING(300), allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'notification_digest_items' },
    );
  }
}
