import { CLIENT_EVENTS } from '../../src/contract/socket';
import type { HoldfireServer, HoldfireSocket } from './types';

const syncSchema = CLIENT_EVENTS['clock:sync'].schema;

/** NTP-style sample: the client pairs its send and receive times with the server time to estimate its offset. */
export function registerClockHandlers(_io: HoldfireServer, socket: HoldfireSocket, now: () => number = Date.now) {
  socket.on('clock:sync', (payload, ack) => {
    if (typeof ack !== 'function') return;
    const parsed = syncSchema.safeParse(payload);
    if (!parsed.success) {
      ack({ error: 'clock:sync needs { clientSentAt: number }' });
      return;
    }
    ack({ data: { clientSentAt: parsed.data.clientSentAt, serverAt: now() } });
  });
}
