import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Me, User as UserDto } from '../../src/contract/people';
import type { NotificationPrefs } from '../../src/contract/notifications';
import type { Role } from '../../src/domain/people/roles';
import { jsonColumn } from './json-column';
import type { Team } from './team.model';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare email: string;
  declare name: string;
  declare passwordHash: string;
  declare roles: Role[];
  /** How this person takes each kind of e-mail notice; null: every notice at once. */
  declare notificationPrefs: CreationOptional<Partial<NotificationPrefs> | null>;
  declare active: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        name: { type: DataTypes.STRING(120), allowNull: false },
        passwordHash: { type: DataTypes.STRING(100), allowNull: false },
        roles: jsonColumn<Role[]>('roles', []),
        notificationPrefs: { ...jsonColumn<Partial<NotificationPrefs> | null>('notificationPrefs', null), allowNull: true },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users' },
    );
  }

  toMe(): Me {
    return { id: this.id, email: this.email, name: this.name, roles: this.roles };
  }

  toDto(): UserDto {
    return { ...this.toMe(), active: this.active, createdAt: this.createdAt.toISOString() };
  }
}
