import type { SignInLimits } from './auth/rate-limit';
import { createApp, type HoldfireApp } from './app';
import { loadConfig, type Config } from './config';
import { openDatabase } from './db';
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
  await migrate(sequelize);
  if (config.seed === 'demo') await seedDemo({ passwordCost: options.passwordCost, dataDir: config.dataDir });

  const smtp = config.smtpUrl ? undefined : await startFakeSmtp();
  const mailer = createMailer(config.smtpUrl ?? smtp!.url, config.mailFrom, { local: !config.smtpUrl });
  const holdfire = createApp({ config, sequelize, mailer, localMail: !config.smtpUrl, signInLimits: options.signInLimits, log: options.log });
  // Before anyone connects: a count that was counting when the server stopped is put on hold, never resumed.
  await holdfire.counts.recover();
  const stopDigests = startDigestTimer(holdfire.notifier, options.log ?? ((message, error) => console.error(message, error)));
  return {
    ...holdfire,
    config,
    smtp,
    async shutdown() {
      stopDigests();
      await holdfire.close();
      mailer.close();
      await smtp?.close();
      await sequelize.close();
    },
  };
}
