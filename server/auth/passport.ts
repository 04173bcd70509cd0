import type { Request } from 'express';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models';
import { verifyPassword } from './passwords';

/** A Passport instance of our own, so tests can build several apps in one process. */
export function createPassport() {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      User.findOne({ where: { email: email.trim().toLowerCase() } })
        .then(async (user) => {
          const ok = await verifyPassword(password, user?.passwordHash);
          done(null, ok && user && user.active ? user : false);
        })
        .catch(done);
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: unknown, done) => {
    if (typeof id !== 'number') return done(null, false);
    User.findByPk(id)
      .then((user) => done(null, user && user.active ? user : false))
      .catch(done);
  });
  return passport;
}

export type HoldfirePassport = ReturnType<typeof createPassport>;

/** Runs the local strategy and resolves to the user, or false for wrong credentials. */
export function authenticateLocal(passport: HoldfirePassport, req: Request): Promise<Express.User | false> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (err: unknown, user: Express.User | false) => {
      if (err) reject(err);
      else resolve(user);
    })(req, req.res!, reject);
  });
}

/** req.login regenerates the session id (passport >= 0.6), so a fixated id is never signed in. */
export function logIn(req: Request, user: Express.User): Promise<void> {
  return new Promise((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
}

export function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
}
