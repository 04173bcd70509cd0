import type { SessionEnder } from '../auth/session-ender';
import { z } from 'zod';
import { updateUserInputSchema } from '../../src/contract/people';
import { HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import { User } from '../models';

const idParams = z.object({ id: z.coerce.number().int().positive('Not a user id') });

async function activeAdminCount(teamId: number): Promise<number> {
  const users = await User.findAll({ where: { active: true, teamId } });
  return users.filter((u) => u.roles.includes('admin')).length;
}

export const userRoutes = ({ sessions }: { sessions: SessionEnder }) => [
  route({
    method: 'get',
    path: '/users',
    access: ['admin'],
    handler: async ({ user }) => {
      const users = await User.findAll({ where: { teamId: user!.teamId }, order: [['name', 'ASC']] });
      return users.map((u) => u.toDto());
    },
  }),
  route({
    method: 'patch',
    path: '/users/:id',
    access: ['admin'],
    params: idParams,
    body: updateUserInputSchema,
    handler: async ({ params, body, user }) => {
      const target = await User.findOne({ where: { id: params.id, teamId: user!.teamId } });
      if (!target) throw notFound('No such user.');
      if (target.id === user!.id && body.active === false) {
        throw new HttpError(400, 'self_deactivation', 'You cannot deactivate your own account.');
      }
      const wasActiveAdmin = target.active && target.roles.includes('admin');
      const roles = body.roles ?? target.roles;
      const active = body.active ?? target.active;
      if (wasActiveAdmin && !(active && roles.includes('admin')) && (await activeAdminCount(user!.teamId)) <= 1) {
        throw new HttpError(400, 'last_admin', 'This is the last active administrator: make someone else an administrator first.');
      }
      target.roles = roles;
      target.active = active;
      await target.save();
      // A deactivated person is signed out everywhere at once; a role change ends open sockets so they reconnect with the new roles.
      if (!active) await sessions.endUserSessions(target.id, 'deactivated');
      else if (body.roles) sessions.endUserSockets(target.id, 'roles-changed');
      return target.toDto();
    },
  }),
];
