import { createAdapter, type RedisAdapter } from '@socket.io/redis-adapter';
import { createClient } from 'redis';
import type { SignInLimits } from './auth/rate-limit';
import { createApp, type HoldfireApp } from './app';
import { loadConfig, type Config } from './config';
import { openDatabase, withStartupLock } from './db';
import { migrate } from './db/migrator';
import { seedDemo } from './db/seed';
import { startFakeSmtp, type FakeSmtp } from './mail/fake-smtp';
import { createMailer } from './mail/mailer';
import { startDigestTimer } from './mail/notify';
import { initModels } from './models';

export interface Holdfire extends HoldfireApp {
  config: Config;
  smtp: FakeSmtp | undefined;
  shutdown(): Promise<void>;
}

/** Everything start-up does before listening: config, database, migrations, seed, mail, the app. */
export async function startHoldfire(
  env: NodeJS.ProcessEnv = process.env,
  options: { signInLimits?: SignInLimits; passwordCost?: number; log?: (message: string, error?: unknown) => void } = {},
): Promise<Holdfire> {
  const config = loadConfig(env);
  const sequelize = await openDatabase(config);
  initModels(sequelize);
  // Processes started together on one PostgreSQL migrate and seed one after the other.
  await withStartupLock(sequelize, async () => {
    await migrate(sequelize);
    if (config.seed === 'demo') await seedDemo({ passwordCost: options.passwordCost, dataDir: config.dataDir });
  });

  const smtp = config.smtpUrl ? undefined : await startFakeSmtp();
  const mailer = createMailer(config.smtpUrl ?? smtp!.url, config.mailFrom, { local: !config.smtpUrl });
  const holdfire = createApp({ config, sequelize, mailer, localMail: !config.smtpUrl, signInLimits: options.signInLimits, log: options.log });
  const redis = config.redisUrl ? await shareRooms(holdfire, config.redisUrl, options.log) : undefined;
  // Before anyone connects: a count that was counting when the server stopped is put on hold, never resumed.
  // While other processes run, the counts are theirs as much as ours and go on (docs/scale-out.md).
  if (!redis || (await redis.otherProcesses()) === 0) await holdfire.counts.recover();
  const stopDigests = startDigestTimer(holdfire.notifier, options.log ?? ((message, error) => console.error(message, error)));
  return {
    ...holdfire,
    config,
    smtp,
    async shutdown() {
      stopDigests();
      await holdfire.close();
      await redis?.close();
      mailer.close();
      await smtp?.close();
      await sequelize.close();
    },
  };
}

/**
 * socket.io rooms shared with the other Holdfire processes through Redis: a broadcast to a count's room reaches
 * the sockets of every process, and fetchSockets() sees them all.
 */
async function shareRooms(holdfire: HoldfireApp, url: string, log: ((message: string, error?: unknown) => void) | undefined) {
  const pub = createClient({ url });
  const sub = pub.duplicate();
  const report = (error: unknown) => (log ?? console.error)('redis connection failed', error);
  pub.on('error', report);
  sub.on('error', report);
  await Promise.all([pub.connect(), sub.connect()]);
  holdfire.io.adapter(createAdapter(pub, sub));
  const adapter = holdfire.io.of('/').adapter as unknown as RedisAdapter;
  return {
    /** How many other processes share the rooms, once this one's own subscription shows. */
    async otherProcesses(): Promise<number> {
      for (let i = 0; i < 40; i++) {
        const n = await adapter.serverCount();
        if (n >= 1) return n - 1;
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
      return 0;
    },
    async close() {
      await Promise.allSettled([pub.quit(), sub.quit()]);
    },
  };
}
