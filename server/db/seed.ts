import type { Role } from '../../src/domain/people/roles';
import { hashPassword } from '../auth/passwords';
import { Team, User } from '../models';
import { seedDemoHazards, seedDemoMatrix } from './seed-hazards';
import { sensorTimeline } from '../../src/domain/sensors/timeline';
import { createUploadStore } from '../uploads/store';
import { seedDemoAnomalies } from './seed-anomalies';
import { seedDemoCounts } from './seed-counts';
import { seedDemoSensorData } from './seed-sensors';
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

/**
 * Seeds the demo team once: only into an install with no team yet. With `dataDir`, the fired demo count also gets
 * its recorded sensor data (files go to the upload store there, after the database part is committed).
 */
export async function seedDemo(options: { passwordCost?: number; dataDir?: string } = {}): Promise<boolean> {
  if ((await Team.count()) > 0) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD, options.passwordCost);
  const { teamId, counts, dataUserId } = await Team.sequelize!.transaction(async (transaction) => {
    const team = await Team.create(DEMO_TEAM, { transaction });
    const users: User[] = [];
    for (const user of DEMO_USERS) {
      users.push(await User.create({ ...user, teamId: team.id, passwordHash }, { transaction }));
    }
    await seedDemoHazards(team.id, users, transaction);
    await seedDemoMatrix(team.id, users, transaction);
    await seedDemoProcedures(team.id, users, transaction);
    const counts = await seedDemoCounts(team.id, users, transaction);
    // The redline of the third count became the demo anomaly, linked to the surge hazard.
    await seedDemoAnomalies({ countId: counts.redline.countId, at: counts.redline.redlineAt, users, team, transaction });
    return { teamId: team.id, counts, dataUserId: users.find((u) => u.name === 'Noor Fairweather')?.id };
  });
  if (options.dataDir) {
    const { countId, t0At, report } = counts.completed;
    await seedDemoSensorData({ uploads: createUploadStore(options.dataDir), teamId, countId, t0At, holds: sensorTimeline(report).holds, userId: dataUserId });
  }
  return true;
}
