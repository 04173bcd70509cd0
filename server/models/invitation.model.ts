import {
  DataTypes,
  Model,
  type CreationOptional,
  type ForeignKey,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Invitation as InvitationDto } from '../../src/contract/people';
import type { Role } from '../../src/domain/people/roles';
import { jsonColumn } from './json-column';
import type { Team } from './team.model';
import type { User } from './user.model';

export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<number>;
  declare teamId: ForeignKey<Team['id']>;
  declare invitedById: ForeignKey<User['id']> | null;
  declare email: string;
  declare roles: Role[];
  /** SHA-256 of the token mailed out; the token itself is never stored. */
  declare tokenHash: string;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Invitation.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        email: { type: DataTypes.STRING(254), allowNull: false },
        roles: jsonColumn<Role[]>('roles', []),
        tokenHash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'invitations' },
    );
  }

  toDto(): InvitationDto {
    return {
      id: this.id,
      email: this.email,
      roles: this.roles,
      expiresAt: this.expiresAt.toISOString(),
      acceptedAt: this.acceptedAt ? this.acceptedAt.toISOString() : null,
      createdAt: this.createdAt.toISOString(),
    };
  }
}
