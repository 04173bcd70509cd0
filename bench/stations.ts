/**
 * A bench process of simulated stations: socket.io clients with real sessions that answer GO to every poll
 * asking their station, and raw `ws` clients that answer the reference's polls. Driven over IPC by poll-rtt.ts.
 *
 * For the reconnect storm (bench/load.ts) every station socket drops its connection and rejoins from its last
 * seq the way the client does (src/features/counts/hooks/useLiveCount.ts): broadcasts that arrive while the join
 * is unanswered wait, then the catch-up and the waiting broadcasts are folded in seq order, and those the
 * station already has (the overlap the join allows by design) are dropped.
 */
import { performance } from 'node:perf_hooks';
import { io as connect, type Socket } from 'socket.io-client';
import WebSocket from 'ws';
import type { CountEventDto } from '../src/contract/count';
import type { FromStations, StationStats, StormReport, ToStations } from './protocol';

if (!process.send) throw new Error('bench/stations.ts runs as a child of bench/poll-rtt.ts');
const send = (m: FromStations) => process.send!(m);
/** Wall-clock ms with sub-ms resolution, comparable between the bench's processes on one machine. */
const wallNow = () => performance.timeOrigin + performance.now();

const stats: StationStats = { duplicated: 0, lost: 0, refused: 0, answered: 0, wsReplies: 0, sioReplies: 0, sioAcks: 0 };
const wsClients: WebSocket[] = [];
const sioClients: Socket[] = [];

type Ack = { data?: { events: CountEventDto[] }; error?: string };

interface Storm {
  /** When this process dropped its sockets. */
  at: number;
  /** seq -> when this station applied it. */
  appliedAt: Map<number, number>;
  rejoinedAt: number | null;
  catchUp: number;
  /** The seqs the rejoin's catch-up carried: their broadcasts may still come (before or after the answer). */
  catchUpSeqs: Set<number>;
  /** Size of the join's answer (JSON), bytes. */
  replyBytes: number;
}

interface BenchStationSocket {
  code: string;
  countId: number;
  socket: Socket;
  lastSeq: number;
  lastHash: string | null;
  /** False while a rejoin's count:join is unanswered: broadcasts wait in `buffer`. */
  joined: boolean;
  buffer: CountEventDto[];
  storm: Storm | null;
  chainBroken: boolean;
}

const stations: BenchStationSocket[] = [];
let overlap = 0;
let closing = false;

/** One event in order: seqs and the hash chain are checked, and a poll asking this station is answered GO. */
function apply(st: BenchStationSocket, e: CountEventDto) {
  if (st.lastSeq >= 0) {
    if (e.seq <= st.lastSeq) {
      // A broadcast of an event the rejoin's catch-up carried is the overlap the join allows: the client drops it.
      if (st.joined && st.storm?.catchUpSeqs.has(e.seq)) overlap += 1;
      else stats.duplicated += 1;
      return;
    }
    if (e.seq > st.lastSeq + 1) stats.lost += e.seq - st.lastSeq - 1;
    else if (st.storm && st.lastHash !== null && e.prevHash !== st.lastHash) st.chainBroken = true;
  }
  st.lastSeq = e.seq;
  st.lastHash = e.hash;
  st.storm?.appliedAt.set(e.seq, wallNow());
  if (e.type !== 'poll:opened') return;
  const poll = e.payload as { pollId: string; stations: string[] };
  if (!poll.stations.includes(st.code)) return;
  st.socket
    .timeout(30_000)
    .emitWithAck('count:command', { countId: st.countId, command: { type: 'poll:answer', pollId: poll.pollId, station: st.code, answer: 'go' } })
    .then((ack: Ack) => {
      if (ack.error) {
        stats.refused += 1;
        console.error(`[stations] ${st.code}: ${ack.error}`);
      } else stats.answered += 1;
    })
    .catch((error: Error) => {
      stats.refused += 1;
      console.error(`[stations] ${st.code}: no answer to poll:answer (${error.message})`);
    });
}

function connected(socket: Socket): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });
}

async function station(url: string, countId: number, code: string, cookie: string): Promise<void> {
  const socket = connect(url, { transports: ['websocket'], reconnection: false, forceNew: true, timeout: 30_000, extraHeaders: { cookie } });
  const st: BenchStationSocket = { code, countId, socket, lastSeq: -1, lastHash: null, joined: true, buffer: [], storm: null, chainBroken: false };
  stations.push(st);
  // On the first join seqs are checked on the broadcasts only: the join's catch-up may overlap the first broadcasts
  // by design, and these stations do not need the history.
  socket.on('disconnect', (reason, description) => {
    if (st.joined && !closing) console.error(`[stations] ${code} disconnected: ${reason} ${description ? JSON.stringify(description, ['message', 'description', 'context']) : ''}`);
  });
  socket.on('count:events', (list: CountEventDto[]) => {
    if (!st.joined) st.buffer.push(...list);
    else list.forEach((e) => apply(st, e));
  });
  await connected(socket);
  const joined = (await socket.timeout(30_000).emitWithAck('count:join', { countId, sinceSeq: 0 })) as Ack;
  if (joined.error) throw new Error(`${code} could not join: ${joined.error}`);
}

/** Reconnects a dropped station and rejoins from its last seq; the catch-up, then what waited, in seq order. */
async function rejoin(st: BenchStationSocket): Promise<void> {
  const up = connected(st.socket);
  st.socket.connect();
  await up.catch((error: Error) => {
    throw new Error(`${st.code} could not reconnect: ${error.message}`);
  });
  const reply = (await st.socket
    .timeout(60_000)
    .emitWithAck('count:join', { countId: st.countId, sinceSeq: st.lastSeq })
    .catch((error: Error) => {
      throw new Error(`${st.code} rejoin: ${error.message} (${st.socket.connected ? 'connected' : 'not connected'})`);
    })) as Ack;
  if (reply.error) throw new Error(`${st.code} could not rejoin: ${reply.error}`);
  const storm = st.storm!;
  storm.rejoinedAt = wallNow();
  storm.catchUp = reply.data!.events.length;
  storm.replyBytes = JSON.stringify(reply).length;
  // The catch-up comes from the log after `sinceSeq`: anything at or below it there would be a double.
  for (const e of reply.data!.events) apply(st, e);
  for (const e of reply.data!.events) storm.catchUpSeqs.add(e.seq);
  const waiting = st.buffer.splice(0).sort((a, b) => a.seq - b.seq);
  st.joined = true;
  for (const e of waiting) {
    if (e.seq <= st.lastSeq) overlap += 1;
    else apply(st, e);
  }
}

async function storm(): Promise<void> {
  const at = wallNow();
  overlap = 0;
  const gone = stations.map(
    (st) =>
      new Promise<void>((resolve) => {
        st.joined = false;
        st.buffer = [];
        st.storm = { at, appliedAt: new Map(), rejoinedAt: null, catchUp: 0, catchUpSeqs: new Set(), replyBytes: 0 };
        st.chainBroken = false;
        st.socket.once('disconnect', () => resolve());
        // The connection closes under the socket, as when the network goes: the server sees a transport close.
        st.socket.io.engine.close();
      }),
  );
  await Promise.all(gone);
  send({ type: 'dropped', at });
  // A station that cannot come back is reported, not fatal: the others' figures still count.
  const failed: string[] = [];
  await Promise.all(
    stations.map((st) =>
      rejoin(st).catch((error: Error) => {
        failed.push(error.message);
        console.error(`[stations] ${error.message}`);
      }),
    ),
  );
  send({ type: 'rejoined', failed });
}

function stormReport(targetSeq: number): StormReport {
  return {
    caughtUpMs: stations.map((st) => {
      const t = st.storm?.appliedAt.get(targetSeq);
      return t === undefined ? null : t - st.storm!.at;
    }),
    rejoinMs: stations.map((st) => (st.storm?.rejoinedAt ?? NaN) - (st.storm?.at ?? NaN)),
    catchUpEvents: stations.map((st) => st.storm?.catchUp ?? 0),
    replyBytes: stations.map((st) => st.storm?.replyBytes ?? 0),
    lastSeqs: stations.map((st) => st.lastSeq),
    overlap,
    chainBreaks: stations.filter((st) => st.chainBroken).length,
  };
}

function wsClient(wsUrl: string, index: number): Promise<void> {
  const socket = new WebSocket(`${wsUrl}/?role=station`);
  wsClients.push(socket);
  socket.on('message', (data) => {
    const poll = JSON.parse(data.toString()) as { id: number; answerSize: number; relaySize: number };
    const head = JSON.stringify({ id: poll.id, station: index, relaySize: poll.relaySize, pad: '' });
    socket.send(JSON.stringify({ id: poll.id, station: index, relaySize: poll.relaySize, pad: 'x'.repeat(Math.max(0, poll.answerSize - head.length)) }));
    stats.wsReplies += 1;
  });
  return new Promise((resolve, reject) => {
    socket.once('open', () => resolve());
    socket.once('error', reject);
  });
}

/** A station of the bare socket.io reference: answers each poll with an acknowledged reply. */
function sioClient(sioUrl: string, index: number): Promise<void> {
  const socket = connect(sioUrl, { transports: ['websocket'], reconnection: false, forceNew: true, query: { role: 'station' } });
  sioClients.push(socket);
  socket.on('poll', (poll: { id: number; answerSize: number; ackSize: number; relaySize: number }) => {
    const head = { id: poll.id, station: index, ackSize: poll.ackSize, relaySize: poll.relaySize };
    const text = JSON.stringify({ ...head, pad: '' });
    socket.emit('answer', { ...head, pad: 'x'.repeat(Math.max(0, poll.answerSize - text.length)) }, () => (stats.sioAcks += 1));
    stats.sioReplies += 1;
  });
  return connected(socket);
}

async function closeAll(): Promise<void> {
  closing = true;
  for (const st of stations.splice(0)) st.socket.disconnect();
  for (const s of sioClients.splice(0)) s.disconnect();
  closing = false;
  await Promise.all(
    wsClients.splice(0).map(
      (s) =>
        new Promise<void>((resolve) => {
          if (s.readyState === WebSocket.CLOSED) return resolve();
          s.once('close', () => resolve());
          s.close();
        }),
    ),
  );
}

process.on('message', (m: ToStations) => {
  void (async () => {
    try {
      if (m.type === 'holdfire') {
        // A few at a time: 200 handshakes at once would time out on a loaded 2-core machine.
        for (let i = 0; i < m.stations.length; i += 10) {
          await Promise.all(m.stations.slice(i, i + 10).map((s) => station(m.url, s.countId ?? m.countId, s.code, s.cookie)));
        }
        send({ type: 'ready', what: 'holdfire' });
      } else if (m.type === 'ws') {
        for (let i = 0; i < m.clients; i += 10) {
          await Promise.all(Array.from({ length: Math.min(10, m.clients - i) }, (_, j) => wsClient(m.wsUrl, m.firstIndex + i + j)));
        }
        send({ type: 'ready', what: 'ws' });
      } else if (m.type === 'sio') {
        for (let i = 0; i < m.clients; i += 10) {
          await Promise.all(Array.from({ length: Math.min(10, m.clients - i) }, (_, j) => sioClient(m.sioUrl, m.firstIndex + i + j)));
        }
        send({ type: 'ready', what: 'sio' });
      } else if (m.type === 'stats') {
        send({ type: 'stats', stats: { ...stats } });
      } else if (m.type === 'storm') {
        await storm();
      } else if (m.type === 'storm-report') {
        send({ type: 'storm-report', report: stormReport(m.targetSeq) });
      } else if (m.type === 'close') {
        await closeAll();
        Object.assign(stats, { duplicated: 0, lost: 0, refused: 0, answered: 0, wsReplies: 0, sioReplies: 0, sioAcks: 0 });
        send({ type: 'closed' });
      }
    } catch (error) {
      send({ type: 'error', message: error instanceof Error ? error.message : String(error) });
    }
  })();
});
process.on('disconnect', () => {
  void closeAll().finally(() => process.exit(0));
});
