import type { Sequelize } from 'sequelize';
import { Invitation } from './invitation.model';
import { MailMessage } from './mail-message.model';
import { PasswordReset } from './password-reset.model';
import { Session } from './session.model';
import { Team } from './team.model';
import { User } from './user.model';

/** Every model and association, in one place. */
export function initModels(sequelize: Sequelize) {
  for (const model of [Team, User, Invitation, PasswordReset, MailMessage, Session]) model.initModel(sequelize);

  Team.hasMany(User, { foreignKey: 'teamId' });
  User.belongsTo(Team, { foreignKey: 'teamId' });
  Team.hasMany(Invitation, { foreignKey: 'teamId' });
  Invitation.belongsTo(User, { as: 'invitedBy', foreignKey: 'invitedById' });
  User.hasMany(PasswordReset, { foreignKey: 'userId' });
  PasswordReset.belongsTo(User, { foreignKey: 'userId' });

  return { Team, User, Invitation, PasswordReset, MailMessage, Session };
}

export { Invitation, MailMessage, PasswordReset, Session, Team, User };
