import type { RequestHandler } from 'express';
import { loginInputSchema } from '../../src/contract/people';
import { authenticateLocal, logIn, logOut, type HoldfirePassport } from '../auth/passport';
import type { SessionEnder } from '../auth/session-ender';
import { HttpError } from '../http/errors';
import { route } from '../http/route';

export function authRoutes(deps: {
  passport: HoldfirePassport;
  limiters: RequestHandler[];
  generateCsrfToken: (req: Parameters<RequestHandler>[0]) => string;
  sessions: SessionEnder;
}) {
  return [
    route({
      method: 'get',
      path: '/auth/csrf',
      access: 'public',
      handler: ({ req }) => ({ csrfToken: deps.generateCsrfToken(req) }),
    }),
    route({
      method: 'post',
      path: '/auth/login',
      access: 'public',
      before: deps.limiters,
      body: loginInputSchema,
      handler: async ({ req, res }) => {
        const user = await authenticateLocal(deps.passport, req);
        if (!user) throw new HttpError(401, 'bad_credentials', 'E-mail or password is not right.');
        await logIn(req, user);
        res.status(200);
        return { id: user.id, email: user.email, name: user.name, roles: user.roles };
      },
    }),
    route({
      method: 'post',
      path: '/auth/logout',
      access: 'public',
      handler: async ({ req }) => {
        if (!req.user) return;
        // Passport gives the session a new id on sign-out: remember the old one to close its sockets.
        const sid = req.sessionID;
        await logOut(req);
        deps.sessions.endSessionSockets(sid, 'signed-out');
      },
    }),
    route({
      method: 'get',
      path: '/auth/me',
      access: 'signed-in',
      handler: ({ user }) => ({ id: user!.id, email: user!.email, name: user!.name, roles: user!.roles }),
    }),
  ];
}
