import type { SessionEnder } from '../auth/session-ender';
import { passwordChangeSchema, profileUpdateSchema } from '../../src/contract/people';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import { NotificationDigestItem, User } from '../models';
import { prefsOf, type Notifier } from '../mail/notify';
import { notificationPrefsInputSchema, type NotificationPrefsDto } from '../../src/contract/notifications';

async function prefsDto(user: User, notifier: Notifier): Promise<NotificationPrefsDto> {
  const waiting = await NotificationDigestItem.count({ where: { userId: user.id, sentAt: null } });
  return { prefs: prefsOf(user), digestHourUtc: notifier.digestHourUtc, waiting };
}

async function me(id: number): Promise<User> {
  const user = await User.findByPk(id);
  if (!user) throw notFound('No such user.');
  return user;
}

export const profileRoutes = ({ sessions, notifier }: { sessions: SessionEnder; notifier: Notifier }) => [
  route({
    method: 'patch',
    path: '/profile',
    access: 'signed-in',
    body: profileUpdateSchema,
    handler: async ({ body, user }) => {
      const record = await me(user!.id);
      record.name = body.name;
      await record.save();
      return record.toMe();
    },
  }),
  route({
    method: 'post',
    path: '/profile/password',
    access: 'signed-in',
    body: passwordChangeSchema,
    handler: async ({ body, user, req }) => {
      const record = await me(user!.id);
      if (!(await verifyPassword(body.currentPassword, record.passwordHash))) {
        throw new HttpError(400, 'bad_password', 'Your current password is not right.', [
          { path: 'currentPassword', message: 'Not your current password' },
        ]);
      }
      record.passwordHash = await hashPassword(body.newPassword);
      await record.save();
      // Whoever knew the old password is signed out elsewhere; this session stays.
      await sessions.endUserSessions(record.id, 'password-changed', req.sessionID);
    },
  }),
  route({
    method: 'get',
    path: '/profile/notifications',
    access: 'signed-in',
    handler: async ({ user }) => prefsDto(await me(user!.id), notifier),
  }),
  route({
    method: 'put',
    path: '/profile/notifications',
    access: 'signed-in',
    body: notificationPrefsInputSchema,
    handler: async ({ body, user }) => {
      const record = await me(user!.id);
      const given = Object.fromEntries(Object.entries(body).filter(([, v]) => v !== undefined));
      record.notificationPrefs = { ...prefsOf(record), ...given };
      await record.save();
      return prefsDto(record, notifier);
    },
  }),
];
