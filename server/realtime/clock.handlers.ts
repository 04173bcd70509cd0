import { z } from 'zod';
import type { HoldfireServer, HoldfireSocket } from './types';

const syncSchema = z.strictObject({ clientSentAt: z.number().finite() });

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
