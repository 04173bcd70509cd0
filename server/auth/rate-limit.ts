import { ipKeyGenerator, rateLimit, type Options } from 'express-rate-limit';
import { HttpError } from '../http/errors';

export interface SignInLimits {
  windowMs: number;
  limit: number;
}

export const DEFAULT_SIGN_IN_LIMITS: SignInLimits = { windowMs: 15 * 60 * 1000, limit: 10 };

const tooMany = new HttpError(429, 'rate_limited', 'Too many failed sign-ins. Wait 15 minutes, then try again.');

/**
 * Failed sign-ins are counted per address and per account; a successful one is not counted, so a team
 * signing in on one site network is not locked out by its own good logins.
 */
export function signInLimiters(limits: SignInLimits) {
  const common: Partial<Options> = {
    windowMs: limits.windowMs,
    limit: limits.limit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(tooMany),
  };
  const perAddress = rateLimit({ ...common, keyGenerator: (req) => `ip:${ipKeyGenerator(req.ip ?? 'unknown')}` });
  const perAccount = rateLimit({
    ...common,
    keyGenerator: (req) => {
      const email = (req.body as { email?: unknown } | undefined)?.email;
      return typeof email === 'string' ? `account:${email.trim().toLowerCase().slice(0, 254)}` : 'account:(none)';
    },
  });
  return [perAddress, perAccount];
}

/**
 * Reset-link requests all answer 202, so every one counts: this stops one address from filling someone's
 * inbox with reset mails. Twenty an hour is far above what a person forgetting a password needs.
 */
export function resetRequestLimiter(limits: SignInLimits = { windowMs: 60 * 60 * 1000, limit: 20 }) {
  return rateLimit({
    windowMs: limits.windowMs,
    limit: limits.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `reset:${ipKeyGenerator(req.ip ?? 'unknown')}`,
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'rate_limited', 'Too many reset requests from here. Wait an hour, then try again.')),
  });
}
