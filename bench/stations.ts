/**
 * A bench process of simulated stations: socket.io clients with real sessions that answer GO to every poll
 * asking their station, and raw `ws` clients that answer the reference's polls. Driven over IPC by poll-rtt.ts.
 */
import { io as connect, type Socket } from 'socket.io-client';
import WebSocket from 'ws';
import type { CountEventDto } from '../src/contract/count';
import type { FromStations, StationStats, ToStations } from './protocol';

if (!process.send) throw new Error('bench/stations.ts runs as a child of bench/poll-rtt.ts');
const send = (m: FromStations) => process.send!(m);

const stats: StationStats = { duplicated: 0, lost: 0, refused: 0, answered: 0, wsReplies: 0 };
const sockets: Socket[] = [];
const wsClients: WebSocket[] = [];

type Ack = { data?: unknown; error?: string };

async function station(url: string, countId: number, code: string, cookie: string): Promise<void> {
  const socket = connect(url, { transports: ['websocket'], reconnection: false, forceNew: true, timeout: 10_000, extraHeaders: { cookie } });
  sockets.push(socket);
  // Seqs are checked on the broadcasts only: the join's catch-up may overlap the first broadcasts by design.
  let lastSeq = -1;
  socket.on('count:events', (list: CountEventDto[]) => list.forEach(onEvent));
  function onEvent(e: CountEventDto) {
    if (lastSeq >= 0) {
      if (e.seq <= lastSeq) stats.duplicated += 1;
      else if (e.seq > lastSeq + 1) stats.lost += e.seq - lastSeq - 1;
    }
    lastSeq = Math.max(lastSeq, e.seq);
    if (e.type !== 'poll:opened') return;
    const poll = e.payload as { pollId: string; stations: string[] };
    if (!poll.stations.includes(code)) return;
    socket
      .timeout(30_000)
      .emitWithAck('count:command', { countId, command: { type: 'poll:answer', pollId: poll.pollId, station: code, answer: 'go' } })
      .then((ack: Ack) => {
        if (ack.error) {
          stats.refused += 1;
          console.error(`[stations] ${code}: ${ack.error}`);
        } else stats.answered += 1;
      })
      .catch(() => (stats.refused += 1));
  }
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });
  const joined = (await socket.timeout(30_000).emitWithAck('count:join', { countId, sinceSeq: 0 })) as Ack;
  if (joined.error) throw new Error(`${code} could not join: ${joined.error}`);
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

async function closeAll(): Promise<void> {
  for (const s of sockets.splice(0)) s.disconnect();
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
          await Promise.all(m.stations.slice(i, i + 10).map((s) => station(m.url, m.countId, s.code, s.cookie)));
        }
        send({ type: 'ready', what: 'holdfire' });
      } else if (m.type === 'ws') {
        for (let i = 0; i < m.clients; i += 10) {
          await Promise.all(Array.from({ length: Math.min(10, m.clients - i) }, (_, j) => wsClient(m.wsUrl, m.firstIndex + i + j)));
        }
        send({ type: 'ready', what: 'ws' });
      } else if (m.type === 'stats') {
        send({ type: 'stats', stats: { ...stats } });
      } else if (m.type === 'close') {
        await closeAll();
        Object.assign(stats, { duplicated: 0, lost: 0, refused: 0, answered: 0, wsReplies: 0 });
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
