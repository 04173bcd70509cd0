/**
 * The bench's server process: the real Holdfire server (startHoldfire on a temporary SQLite file, listening on
 * 127.0.0.1) and, in the same process, the raw `ws` reference server. Driven over IPC by bench/poll-rtt.ts.
 *
 * It also times the stages of a command from inside, by wrapping three methods of the running app (bench only):
 * CountService.command, EventLog.append, the count room's emit and Count.update.
 */
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { performance } from 'node:perf_hooks';
import { Server as SocketIoServer, type Socket as SocketIoSocket } from 'socket.io';
import { WebSocketServer, type WebSocket } from 'ws';
import { hashPassword } from '../server/auth/passwords';
import { startHoldfire } from '../server/bootstrap';
import { Count, CrewAssignment, CrewPlan, Station, Team, User } from '../server/models';
import { STATION_PASSWORD, type BenchStation, type FromServer, type ServerMemory, type ServerTimings, type ToServer } from './protocol';

const send = (m: FromServer) => process.send!(m);
const dataDir = process.env.BENCH_DATA_DIR;
if (!dataDir || !process.send) throw new Error('bench/server.ts runs as a child of bench/poll-rtt.ts');

const holdfire = await startHoldfire(
  {
    HOLDFIRE_DATA_DIR: dataDir,
    DATABASE_URL: `sqlite:${dataDir}/holdfire.sqlite`,
    HOLDFIRE_SEED: 'demo',
    NODE_ENV: 'test',
    HOST: '127.0.0.1',
    APP_URL: 'http://127.0.0.1',
  },
  { passwordCost: 4, signInLimits: { windowMs: 60_000, limit: 10_000 }, log: (m, e) => console.error('[server]', m, e) },
);
await new Promise<void>((resolve) => holdfire.httpServer.listen(0, '127.0.0.1', resolve));
const port = (holdfire.httpServer.address() as AddressInfo).port;

// ---------------------------------------------------------------- stage timings (bench-only wrappers)

const t: Omit<ServerTimings, 'cpuMicros' | 'rssBytes' | 'commits'> = {
  commandMs: 0,
  commands: 0,
  appendMs: 0,
  appends: 0,
  broadcastMs: 0,
  broadcasts: 0,
  statusUpdateMs: 0,
  statusUpdates: 0,
};
const update = Count.update.bind(Count);
Count.update = (async (...args: Parameters<typeof update>) => {
  const start = performance.now();
  try {
    return await update(...args);
  } finally {
    t.statusUpdateMs += performance.now() - start;
    t.statusUpdates += 1;
  }
}) as typeof Count.update;
const counts = holdfire.counts;
const command = counts.command.bind(counts);
counts.command = async (...args) => {
  const start = performance.now();
  try {
    return await command(...args);
  } finally {
    t.commandMs += performance.now() - start;
    t.commands += 1;
  }
};
const log = holdfire.eventLog;
const append = log.append.bind(log);
log.append = async (...args) => {
  const start = performance.now();
  try {
    return await append(...args);
  } finally {
    t.appendMs += performance.now() - start;
    t.appends += 1;
  }
};
const io = holdfire.io;
const to = io.to.bind(io);
io.to = ((room: string) => {
  const op = to(room);
  if (!room.startsWith('count:')) return op;
  const emit = op.emit.bind(op) as (event: string, ...args: unknown[]) => boolean;
  op.emit = ((event: string, ...args: unknown[]) => {
    const start = performance.now();
    const r = emit(event, ...args);
    t.broadcastMs += performance.now() - start;
    t.broadcasts += 1;
    return r;
  }) as typeof op.emit;
  return op;
}) as typeof io.to;

// ---------------------------------------------------------------- the raw ws reference

/**
 * The conductor's message goes to every station; each station's reply is counted and passed on to the
 * conductor as one message of the size Holdfire's poll:answered has. Nothing is stored.
 */
const wss = new WebSocketServer({ host: '127.0.0.1', port: 0 });
await new Promise<void>((resolve) => wss.once('listening', resolve));
const stationSockets = new Set<WebSocket>();
let conductor: WebSocket | null = null;
wss.on('connection', (socket, req) => {
  if (req.url?.includes('role=conductor')) {
    conductor = socket;
    socket.on('message', (data) => {
      const text = data.toString();
      for (const s of stationSockets) s.send(text);
    });
    return;
  }
  stationSockets.add(socket);
  socket.on('close', () => stationSockets.delete(socket));
  socket.on('message', (data) => {
    const reply = JSON.parse(data.toString()) as { id: number; station: number; relaySize: number };
    const head = JSON.stringify({ id: reply.id, station: reply.station, pad: '' });
    conductor?.send(JSON.stringify({ id: reply.id, station: reply.station, pad: 'x'.repeat(Math.max(0, reply.relaySize - head.length)) }));
  });
});
const wsPort = (wss.address() as AddressInfo).port;

// ---------------------------------------------------------------- the bare socket.io reference

/**
 * socket.io with nothing behind it, in the message pattern of a Holdfire poll: the conductor's message goes to the
 * stations' room as one broadcast; each station's reply is acknowledged (the acknowledgement of the size of
 * Holdfire's answer to poll:answer) and passed on to the conductor (the size of poll:answered). Nothing is checked,
 * stored or folded: what socket.io itself costs over raw ws for the same exchange.
 */
const sioHttp = createServer();
const sio = new SocketIoServer(sioHttp, { transports: ['websocket'] });
let sioConductor: SocketIoSocket | null = null;
const pad = (head: object, size: number) => {
  const text = JSON.stringify({ ...head, pad: '' });
  return { ...head, pad: 'x'.repeat(Math.max(0, size - text.length)) };
};
sio.on('connection', (socket) => {
  if (socket.handshake.query.role === 'conductor') {
    sioConductor = socket;
    socket.on('open', (poll: { id: number }) => sio.to('stations').emit('poll', poll));
    return;
  }
  void socket.join('stations');
  socket.on('answer', (reply: { id: number; station: number; ackSize: number; relaySize: number }, ack: (a: unknown) => void) => {
    ack({ data: pad({ id: reply.id }, reply.ackSize) });
    sioConductor?.emit('answered', pad({ id: reply.id, station: reply.station }, reply.relaySize));
  });
});
await new Promise<void>((resolve) => sioHttp.listen(0, '127.0.0.1', resolve));
const sioPort = (sioHttp.address() as AddressInfo).port;

// ---------------------------------------------------------------- orders from the orchestrator

async function setup(n: number): Promise<FromServer> {
  const team = await Team.findOne({ order: [['id', 'ASC']] });
  if (!team) throw new Error('the demo seed made no team');
  const passwordHash = await hashPassword(STATION_PASSWORD, 4);
  const stations: BenchStation[] = [];
  for (let i = 1; i <= n; i++) {
    const code = `B${String(i).padStart(3, '0')}`;
    await Station.create({ teamId: team.id, code, name: `Bench station ${i}`, callSign: `Bench ${i}`, defaultPpe: [] });
    const email = `bench-${i}@ternvalley.test`;
    const user = await User.create({ teamId: team.id, email, name: `Bench operator ${i}`, passwordHash, roles: ['operator'], active: true });
    stations.push({ code, email, userId: user.id });
  }
  return { type: 'setup', teamId: team.id, stations, password: STATION_PASSWORD };
}

/** A crew plan for the procedure with `n` bench stations after the first `from`, each manned by its own operator. */
async function crew(procedureId: number, n: number, from: number): Promise<FromServer> {
  const team = await Team.findOne({ order: [['id', 'ASC']] });
  const plan = await CrewPlan.create({ teamId: team!.id, name: `Bench crew of ${n}`, procedureId, testDate: null });
  const stations = await Station.findAll({ where: { teamId: team!.id }, order: [['code', 'ASC']] });
  const bench = stations.filter((s) => /^B\d{3}$/.test(s.code)).slice(from, from + n);
  const users = await User.findAll({ where: { teamId: team!.id } });
  const byEmail = new Map(users.map((u) => [u.email, u]));
  await CrewAssignment.bulkCreate(
    bench.map((s) => ({ crewPlanId: plan.id, stationId: s.id, userId: byEmail.get(`bench-${Number(s.code.slice(1))}@ternvalley.test`)!.id })),
  );
  return { type: 'crew', crewPlanId: plan.id };
}

function timings(): ServerTimings {
  const cpu = process.cpuUsage();
  return { ...t, cpuMicros: cpu.user + cpu.system, rssBytes: process.memoryUsage().rss, commits: log.commits };
}

/**
 * Memory after collecting garbage (the process runs with --expose-gc), so it shows what is held: five full
 * collections 300 ms apart, which also gives the heap time to hand freed pages back before RSS is read.
 */
async function memory(): Promise<ServerMemory> {
  const gc = (globalThis as { gc?: () => void }).gc;
  for (let i = 0; i < 5; i++) {
    gc?.();
    await new Promise((r) => setTimeout(r, 300));
  }
  const m = process.memoryUsage();
  return { rssBytes: m.rss, heapUsedBytes: m.heapUsed, externalBytes: m.external, collected: Boolean(gc) };
}

process.on('message', (m: ToServer) => {
  void (async () => {
    try {
      if (m.type === 'setup') send(await setup(m.stations));
      else if (m.type === 'crew') send(await crew(m.procedureId, m.stations, m.from ?? 0));
      else if (m.type === 'memory') send({ type: 'memory', memory: await memory() });
      else if (m.type === 'timings') send({ type: 'timings', timings: timings() });
      else if (m.type === 'stop') {
        for (const s of wss.clients) s.terminate();
        await new Promise<void>((resolve) => wss.close(() => resolve()));
        await sio.close();
        await holdfire.shutdown();
        send({ type: 'stopped' });
        process.disconnect();
      }
    } catch (error) {
      send({ type: 'error', message: error instanceof Error ? (error.stack ?? error.message) : String(error) });
    }
  })();
});
// The orchestrator died: do not linger.
process.on('disconnect', () => process.exit(0));

send({ type: 'listening', url: `http://127.0.0.1:${port}`, wsUrl: `ws://127.0.0.1:${wsPort}`, sioUrl: `http://127.0.0.1:${sioPort}` });
