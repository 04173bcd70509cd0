import type { Role } from '../../src/domain/people/roles';
import { hashPassword } from '../auth/passwords';
import { Team, User } from '../models';
import { seedDemoHazards, seedDemoMatrix } from './seed-hazards';
import { seedDemoCounts } from './seed-counts';
import { seedDemoProcedures } from './seed-procedures';

/** Demo sign-ins for the invented team; for trying Holdfire only, never for a real test site. */
export const DEMO_PASSWORD = 'kestrel-demo';
export const DEMO_TEAM = { name: 'Tern Valley Rocketry Collective', site: 'Marsh End test site' };
export const DEMO_USERS: { email: string; name: string; roles: Role[] }[] = [
  { email: 'admin@ternvalley.test', name: 'Ines Okafor', roles: ['admin'] },
  { email: 'conductor@ternvalley.test', name: 'Marek Lindqvist', roles: ['conductor'] },
  { email: 'safety@ternvalley.test', name: 'Priya Halloran', roles: ['safety'] },
  { email: 'propellants@ternvalley.test', name: 'Tomasz Reyes', roles: ['operator'] },
  { email: 'pad@ternvalley.test', name: 'Aiko Brennan', roles: ['operator'] },
  { email: 'range@ternvalley.test', name: 'Dev Castellano', roles: ['operator'] },
  { email: 'data@ternvalley.test', name: 'Noor Fairweather', roles: ['operator'] },
  { email: 'auditor@ternvalley.test', name: 'Hollis Achebe', roles: ['auditor'] },
];

/** Seeds the demo team once: only into an install with no team yet. */
export async function seedDemo(options: { passwordCost?: number } = {}): Promise<boolean> {
  if ((await Team.count()) > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD, options.passwordCost);
  await Team.sequelize!.transaction(async (transaction) => {
    const team = await Team.create(DEMO_TEAM, { transaction });
    const users: User[] = [];
    for (const user of DEMO_USERS) {
      users.push(await User.create({ ...user, teamId: team.id, passwordHash }, { transaction }));
    }
    await seedDemoHazards(team.id, users, transaction);
    await seedDemoMatrix(team.id, users, transaction);
    await seedDemoProcedures(team.id, users, transaction);
    await seedDemoCounts(team.id, users, transaction);
  });
  return true;
}
