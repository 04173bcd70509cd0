import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { MailMessage as MailMessageDto } from '../../src/contract/people';

/** A message as the embedded SMTP server received it (development and tests only). */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>;
  declare messageId: string | null;
  declare from: string;
  declare to: string;
  declare subject: string;
  declare text: string;
  declare sentAt: Date;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    MailMessage.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        messageId: { type: DataTypes.STRING(300), allowNull: true },
        from: { type: DataTypes.STRING(300), allowNull: false },
        to: { type: DataTypes.TEXT, allowNull: false },
        subject: { type: DataTypes.STRING(500), allowNull: false },
        text: { type: DataTypes.TEXT, allowNull: false },
        sentAt: { type: DataTypes.DATE, allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'mail_messages' },
    );
  }

  toDto(): MailMessageDto {
    return { id: this.id, to: this.to, subject: this.subject, text: this.text, sentAt: this.sentAt.toISOString() };
  }
}
