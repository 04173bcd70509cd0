import type { Sequelize } from 'sequelize';
import type { SignInLimits } from './auth/rate-limit';
import type { Config } from './config';
import type { Mailer } from './mail/mailer';

/** Everything createApp needs from outside; tests build their own. */
export interface AppDeps {
  config: Config;
  sequelize: Sequelize;
  mailer: Mailer;
  /** True when mail goes to the embedded local SMTP server (the outbox page then shows it). */
  localMail: boolean;
  signInLimits?: SignInLimits;
  log?: (message: string, error?: unknown) => void;
}
