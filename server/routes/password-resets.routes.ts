import type { SessionEnder } from '../auth/session-ender';
import { addHours } from 'date-fns';
import { passwordResetCompleteSchema, passwordResetRequestSchema } from '../../src/contract/people';
import { hashPassword } from '../auth/passwords';
import { resetRequestLimiter } from '../auth/rate-limit';
import { hashToken, newToken } from '../auth/tokens';
import type { AppDeps } from '../deps';
import { HttpError } from '../http/errors';
import { route } from '../http/route';
import { passwordResetMail } from '../mail/templates';
import { PasswordReset, User } from '../models';

export const RESET_HOURS = 1;

export function passwordResetRoutes(deps: Pick<AppDeps, 'mailer' | 'config' | 'log'> & { sessions: SessionEnder }) {
  const limiter = resetRequestLimiter();
  return [
    route({
      method: 'post',
      path: '/password-resets',
      access: 'public',
      status: 202,
      before: [limiter],
      body: passwordResetRequestSchema,
      handler: async ({ body }) => {
        const user = await User.findOne({ where: { email: body.email, active: true } });
        // The same answer whether or not the account exists, so the form does not reveal who has one.
        if (user) {
          const { token, hash } = newToken();
          const expiresAt = addHours(new Date(), RESET_HOURS);
          await PasswordReset.create({ userId: user.id, tokenHash: hash, expiresAt, usedAt: null });
          // Not awaited: a known address must answer as fast as an unknown one.
          deps.mailer
            .send(passwordResetMail({ to: user.email, link: `${deps.config.appUrl}/reset-password/${token}`, expiresAt }))
            .catch((error: unknown) => deps.log?.('password reset e-mail failed', error));
        }
        return { ok: true };
      },
    }),
    route({
      method: 'post',
      path: '/password-resets/complete',
      access: 'public',
      body: passwordResetCompleteSchema,
      handler: async ({ body }) => {
        const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(body.token) } });
        if (!reset || reset.usedAt || reset.expiresAt.getTime() < Date.now()) {
          throw new HttpError(410, 'expired', 'This reset link has expired or was used already. Ask for a new one.');
        }
        const user = await User.findByPk(reset.userId);
        if (!user || !user.active) throw new HttpError(410, 'expired', 'This reset link is no longer valid.');
        user.passwordHash = await hashPassword(body.password);
        await User.sequelize!.transaction(async (transaction) => {
          // Claim the token first, so a link sent twice at once sets the password only once.
          const [claimed] = await PasswordReset.update({ usedAt: new Date() }, { where: { id: reset.id, usedAt: null }, transaction });
          if (claimed !== 1) throw new HttpError(410, 'expired', 'This reset link has expired or was used already. Ask for a new one.');
          await user.save({ transaction });
        });
        // A reset means the old password may be known to someone else: end every session it opened.
        await deps.sessions.endUserSessions(user.id, 'password-reset');
      },
    }),
  ];
}
