import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CountEventDto } from '../../src/contract/count';
import { CountService, type CountActor } from '../../server/counts/service';
import { User } from '../../server/models';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp } from '../helpers/app';
import { releasedTinyProcedure } from '../helpers/counts';

/**
 * The count's own timer: set for the clock's next moment, and set again when it fires a moment early (a timer
 * may fire before the service's clock reads its instant: timers and clocks drift apart, and a clock may be
 * stepped back). Nothing else happens in the count meanwhile, so only the timer can bring the step in.
 */
let t: TestApp;
let conductor: CountActor;

beforeAll(async () => {
  t = await startTestApp();
  const u = (await User.findOne({ where: { email: DEMO.conductor } }))!;
  conductor = { id: u.id, teamId: u.teamId, name: u.name, roles: u.roles };
});
afterAll(() => t.stop());

describe('the count clock timer', () => {
  it('sets itself again when it fires before its moment, and the step comes at its own instant', async () => {
    const http = await t.client(DEMO.conductor);
    const rev = await releasedTinyProcedure(http, await t.client(DEMO.safety));
    const countId = (await http.post('/api/counts', { ...rev, name: `Clock ${Date.now()}` }).expect(201)).body.id as number;

    // The service's clock: real time, put back 40 ms once the timer for the next step has been set.
    let offset = 0;
    const events: CountEventDto[] = [];
    const arrived: (() => void)[] = [];
    const service = new CountService({
      log: t.holdfire.eventLog,
      now: () => Date.now() + offset,
      broadcast: (_id, list) => {
        events.push(...list);
        arrived.splice(0).forEach((f) => f());
      },
    });
    try {
      const started = await service.command(conductor.teamId, countId, conductor, { type: 'count:start' });
      const startedAt = started.find((e) => e.type === 'count:started')!.at;
      // The plan starts at T-3 and PROP's step is at T-2: due one second after the start.
      const dueAt = startedAt + 1000;
      offset = -40;

      const deadline = Date.now() + 5000;
      // The step at T-3 is reached at the start itself; the next step:reached is PROP's.
      const reached = () => events.find((e) => e.type === 'step:reached' && e.at > startedAt);
      while (!reached() && Date.now() < deadline) {
        await Promise.race([new Promise<void>((resolve) => arrived.push(resolve)), new Promise((resolve) => setTimeout(resolve, 100))]);
      }
      // The first firing found nothing due (the clock read 40 ms short); the timer set again brought the step.
      expect(reached()).toBeDefined();
      expect(reached()!.at).toBe(dueAt);
      expect(Date.now()).toBeGreaterThanOrEqual(dueAt + 40);
    } finally {
      service.close();
    }
  });
});
