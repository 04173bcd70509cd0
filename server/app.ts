import { existsSync } from 'node:fs';
import { createServer, type Server as HttpServer } from 'node:http';
import path from 'node:path';
import connectSessionSequelize from 'connect-session-sequelize';
import { csrfSync } from 'csrf-sync';
import express, { type Request } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { Server } from 'socket.io';
import { createPassport } from './auth/passport';
import { createSessionEnder, sessionRoom, userRoom } from './auth/session-ender';
import { throttleTouch } from './auth/session-touch';
import { DEFAULT_SIGN_IN_LIMITS, signInLimiters } from './auth/rate-limit';
import type { AppDeps } from './deps';
import { createErrorHandler, HttpError } from './http/errors';
import { mountRoutes, type RouteDef } from './http/route';
import { initModels } from './models';
import { CountEvents } from './counts/events';
import { EventLog } from './counts/log';
import type { CountEvent } from '../src/domain/count/events';
import { countRoom, CountService, mannedStations } from './counts/service';
import { registerClockHandlers } from './realtime/clock.handlers';
import { registerCountHandlers } from './realtime/count.handlers';
import type { HoldfireServer } from './realtime/types';
import { anomalyRoutes } from './routes/anomalies.routes';
import { authRoutes } from './routes/auth.routes';
import { calcRoutes } from './routes/calc.routes';
import { countRoutes } from './routes/counts.routes';
import { crewPlanRoutes } from './routes/crew-plans.routes';
import { hazardRoutes } from './routes/hazards.routes';
import { healthRoutes } from './routes/health.routes';
import { invitationRoutes } from './routes/invitations.routes';
import { mailRoutes } from './routes/mail.routes';
import { passwordResetRoutes } from './routes/password-resets.routes';
import { procedureRoutes } from './routes/procedures.routes';
import { profileRoutes } from './routes/profile.routes';
import { propellantRoutes } from './routes/propellants.routes';
import { riskMatrixRoutes } from './routes/risk-matrices.routes';
import { sensorRoutes } from './routes/sensors.routes';
import { setupRoutes } from './routes/setup.routes';
import { uploadRoutes } from './routes/uploads.routes';
import { stationRoutes } from './routes/stations.routes';
import { userRoutes } from './routes/users.routes';
import { createUploadStore } from './uploads';
import { Notifier } from './mail/notify';
import './types';

const SESSION_HOURS = 12;

export interface HoldfireApp {
  app: express.Express;
  httpServer: HttpServer;
  io: HoldfireServer;
  /** Every API route with its access rule: the table the security tests walk. */
  routes: RouteDef[];
  /** The live counts: recover() at start-up holds any count that was counting when the server stopped. */
  counts: CountService;
  eventLog: EventLog;
  /** E-mail notices as each person chose: at once, in the daily digest, or off. */
  notifier: Notifier;
  close(): Promise<void>;
}

export function createApp(deps: AppDeps): HoldfireApp {
  const { config } = deps;
  const log = deps.log ?? ((message: string, error?: unknown) => console.error(message, error));
  initModels(deps.sequelize);

  const app = express();
  app.set('trust proxy', 'loopback');
  app.disable('x-powered-by');
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'"],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
          ...(config.secureCookies ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: config.secureCookies,
    }),
  );
  app.use(express.json({ limit: '200kb' }));

  const SequelizeStore = connectSessionSequelize(session.Store);
  const store = throttleTouch(new SequelizeStore({ db: deps.sequelize, table: 'Session', checkExpirationInterval: 15 * 60 * 1000 }));
  const sessionMiddleware = session({
    name: 'holdfire.sid',
    secret: config.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: { httpOnly: true, sameSite: 'lax', secure: config.secureCookies, maxAge: SESSION_HOURS * 3600 * 1000 },
  });
  const passport = createPassport();
  app.use(sessionMiddleware);
  app.use(passport.initialize());
  app.use(passport.session());

  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
  });

  const sessions = createSessionEnder();
  const uploads = createUploadStore(config.dataDir, log);
  const eventLog = new EventLog({ sequelize: deps.sequelize, busyTimeoutMs: config.dbBusyTimeoutMs });
  // The socket server is made below; events are only broadcast once it exists (a count cannot be reached before).
  let io: HoldfireServer | undefined;
  const notifier = new Notifier({ mailer: deps.mailer, log, digestHourUtc: config.digestHourUtc, appUrl: config.appUrl });
  const countEvents = new CountEvents({
    notifier,
    appUrl: config.appUrl,
    log,
    readLog: async (countId) => (await eventLog.read(countId)) as unknown as (CountEvent & { hash: string })[],
  });
  const counts = new CountService({
    log: eventLog,
    broadcast: (countId, events) => io?.to(countRoom(countId)).emit('count:events', events),
    onEvents: (count, events) => countEvents.handle(count, events),
    logError: log,
    // Several processes: the count's room spans them all through the socket.io adapter (Redis).
    stationPresentElsewhere: async (countId, station, state) => {
      if (!io) return false;
      const sockets = await io.in(countRoom(countId)).fetchSockets();
      return sockets.some((s) => mannedStations(state, s.data.userId).includes(station));
    },
    // Only with Redis: socket.io's in-memory adapter has no other servers to tell.
    announce: config.redisUrl ? (countId, lastSeq) => io?.serverSideEmit('count:appended', countId, lastSeq) : undefined,
  });
  const routes: RouteDef[] = [
    ...healthRoutes,
    ...authRoutes({
      passport,
      limiters: signInLimiters(deps.signInLimits ?? DEFAULT_SIGN_IN_LIMITS),
      // One token per session, kept until the session changes (sign-in and sign-out make a new session): a second
      // tab or a second client of the same session fetching a token must not void the first one's.
      generateCsrfToken: (req: Request) => generateToken(req),
      sessions,
    }),
    ...setupRoutes,
    ...userRoutes({ sessions }),
    ...invitationRoutes({ ...deps, log }),
    ...passwordResetRoutes({ ...deps, log, sessions }),
    ...profileRoutes({ sessions, notifier }),
    ...mailRoutes,
    ...hazardRoutes({ uploads, notifier }),
    ...riskMatrixRoutes(),
    ...propellantRoutes(),
    ...calcRoutes(),
    ...uploadRoutes({ uploads }),
    ...procedureRoutes({ uploads, notifier }),
    ...stationRoutes(),
    ...crewPlanRoutes(),
    ...countRoutes({ counts, notifier }),
    ...sensorRoutes({ counts, uploads }),
    ...anomalyRoutes({ uploads, counts, notifier, appUrl: config.appUrl, log }),
  ];

  const api = express.Router();
  api.use(csrfSynchronisedProtection);
  api.use(mountRoutes(routes));
  api.use((req) => {
    throw new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}.`);
  });
  app.use('/api', api);

  const clientDir = path.resolve('dist');
  if (existsSync(path.join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Deep links (e-mailed invitation links, a reload on any page) get the client, which routes itself.
    app.get('/{*splat}', (_req, res, next) =>
      res.sendFile(path.join(clientDir, 'index.html'), (error) => {
        // The build can vanish while `vite build` rewrites dist/: say so instead of blaming the request.
        if (error && !res.headersSent) next(new HttpError(503, 'client_unavailable', 'The Holdfire client is being rebuilt. Reload in a moment.'));
      }),
    );
  }
  app.use(createErrorHandler((error) => log('unhandled error', error)));

  const httpServer = createServer(app);
  io = new Server(httpServer, { serveClient: false }) as HoldfireServer;
  const server = io;
  server.engine.use(sessionMiddleware);
  server.engine.use(passport.initialize());
  server.engine.use(passport.session());
  server.use((socket, next) => {
    const request = socket.request as Request;
    const user = request.user;
    if (!user) return next(new Error('Sign in to connect.'));
    socket.data.userId = user.id;
    socket.data.sid = request.sessionID;
    next();
  });
  sessions.attach(server);
  server.on('count:appended', (countId, lastSeq) => {
    if (Number.isInteger(countId) && Number.isInteger(lastSeq)) counts.appendedElsewhere(countId, lastSeq);
  });
  server.on('connection', (socket) => {
    void socket.join([sessionRoom(socket.data.sid), userRoom(socket.data.userId)]);
    registerClockHandlers(server, socket);
    registerCountHandlers(server, socket, counts, log);
  });

  return {
    app,
    httpServer,
    io: server,
    routes,
    counts,
    eventLog,
    notifier,
    async close() {
      store.stopExpiringSessions();
      counts.close();
      await counts.settle();
      await countEvents.settle();
      await notifier.settle();
      // After settle nothing more is appended; the log's own database connection goes with the app.
      await eventLog.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      if (httpServer.listening) await new Promise<void>((resolve) => httpServer.close(() => resolve()));
    },
  };
}
