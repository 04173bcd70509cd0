import { firstAdminInputSchema } from '../../src/contract/people';
import { logIn } from '../auth/passport';
import { hashPassword } from '../auth/passwords';
import { conflict } from '../http/errors';
import { route } from '../http/route';
import { Team, User } from '../models';

/** An empty install (HOLDFIRE_SEED=none) asks its first visitor to create the team and its first admin. */
export const setupRoutes = [
  route({
    method: 'get',
    path: '/setup',
    access: 'public',
    handler: async () => {
      const team = await Team.findOne({ order: [['id', 'ASC']] });
      return { needsFirstAdmin: (await User.count()) === 0, teamName: team?.name ?? null };
    },
  }),
  route({
    method: 'post',
    path: '/setup',
    access: 'public',
    status: 201,
    body: firstAdminInputSchema,
    handler: async ({ body, req }) => {
      const passwordHash = await hashPassword(body.password);
      const user = await User.sequelize!.transaction(async (transaction) => {
        if ((await User.count({ transaction })) > 0) throw conflict('Holdfire is set up already. Sign in instead.', 'already_set_up');
        const team =
          (await Team.findOne({ order: [['id', 'ASC']], transaction })) ??
          (await Team.create({ name: body.teamName, site: null }, { transaction }));
        team.name = body.teamName;
        await team.save({ transaction });
        return User.create({ teamId: team.id, email: body.email, name: body.name, passwordHash, roles: ['admin'] }, { transaction });
      });
      await logIn(req, user);
      return user.toMe();
    },
  }),
];
