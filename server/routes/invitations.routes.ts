import { addDays } from 'date-fns';
import { Op } from 'sequelize';
import { z } from 'zod';
import { acceptInvitationInputSchema, inviteInputSchema, tokenSchema } from '../../src/contract/people';
import { logIn } from '../auth/passport';
import { hashPassword } from '../auth/passwords';
import { hashToken, newToken } from '../auth/tokens';
import type { AppDeps } from '../deps';
import { conflict, HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import { invitationMail } from '../mail/templates';
import { Invitation, Team, User } from '../models';

export const INVITATION_DAYS = 7;

async function findUsable(token: string): Promise<Invitation> {
  const invitation = await Invitation.findOne({ where: { tokenHash: hashToken(token) } });
  if (!invitation) throw notFound('This invitation link is not valid. Ask your administrator for a new one.');
  if (invitation.acceptedAt) throw new HttpError(409, 'used', 'This invitation has been used already. Sign in instead.');
  if (invitation.expiresAt.getTime() < Date.now()) {
    throw new HttpError(410, 'expired', 'This invitation has expired. Ask your administrator for a new one.');
  }
  return invitation;
}

export function invitationRoutes(deps: Pick<AppDeps, 'mailer' | 'config' | 'log'>) {
  return [
    route({
      method: 'get',
      path: '/invitations',
      access: ['admin'],
      handler: async ({ user }) => {
        const list = await Invitation.findAll({
          where: { teamId: user!.teamId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
          order: [['createdAt', 'DESC']],
        });
        return list.map((i) => i.toDto());
      },
    }),
    route({
      method: 'post',
      path: '/invitations',
      access: ['admin'],
      status: 201,
      body: inviteInputSchema,
      handler: async ({ body, user }) => {
        if (await User.findOne({ where: { email: body.email } })) {
          throw conflict('Someone with this e-mail already has an account.', 'already_exists');
        }
        // A new invitation replaces any earlier one still pending for the same address.
        await Invitation.destroy({ where: { email: body.email, acceptedAt: null } });
        const { token, hash } = newToken();
        const expiresAt = addDays(new Date(), INVITATION_DAYS);
        const invitation = await Invitation.create({
          teamId: user!.teamId,
          invitedById: user!.id,
          email: body.email,
          roles: body.roles,
          tokenHash: hash,
          expiresAt,
          acceptedAt: null,
        });
        const team = await Team.findByPk(user!.teamId);
        try {
          await deps.mailer.send(
            invitationMail({
              to: body.email,
              teamName: team?.name ?? 'your team',
              invitedBy: user!.name,
              roles: body.roles,
              link: `${deps.config.appUrl}/invite/${token}`,
              expiresAt,
            }),
          );
        } catch (error) {
          deps.log?.('invitation e-mail failed', error);
          await invitation.destroy();
          throw new HttpError(502, 'mail_failed', 'The invitation e-mail could not be sent, so no invitation was made. Try again.');
        }
        return invitation.toDto();
      },
    }),
    route({
      method: 'get',
      path: '/invitations/by-token/:token',
      access: 'public',
      params: z.object({ token: tokenSchema }),
      handler: async ({ params }) => {
        const invitation = await findUsable(params.token);
        return { email: invitation.email, roles: invitation.roles, expiresAt: invitation.expiresAt.toISOString() };
      },
    }),
    route({
      method: 'post',
      path: '/invitations/accept',
      access: 'public',
      status: 201,
      body: acceptInvitationInputSchema,
      handler: async ({ body, req }) => {
        const invitation = await findUsable(body.token);
        if (await User.findOne({ where: { email: invitation.email } })) {
          throw conflict('Someone with this e-mail already has an account. Sign in instead.', 'already_exists');
        }
        const passwordHash = await hashPassword(body.password);
        const user = await User.sequelize!.transaction(async (transaction) => {
          // Claim the invitation first: of two requests racing with the same link, only one gets it.
          const [claimed] = await Invitation.update(
            { acceptedAt: new Date() },
            { where: { id: invitation.id, acceptedAt: null }, transaction },
          );
          if (claimed !== 1) throw new HttpError(409, 'used', 'This invitation has been used already. Sign in instead.');
          if (await User.findOne({ where: { email: invitation.email }, transaction })) {
            throw conflict('Someone with this e-mail already has an account. Sign in instead.', 'already_exists');
          }
          return User.create(
            { teamId: invitation.teamId, email: invitation.email, name: body.name, passwordHash, roles: invitation.roles },
            { transaction },
          );
        });
        await logIn(req, user);
        return user.toMe();
      },
    }),
  ];
}
