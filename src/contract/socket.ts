/**
 * The typed socket.io event map both sides import. Commands go client -> server and may be acknowledged
 * with `{ data } | { error, details }`; facts go server -> client, named in the past tense.
 */
import { z, type ZodType } from 'zod';
import { countCommandPayloadSchema, countJoinSchema, countLeaveSchema, type CountCommandInput, type CountEventDto, type CountStateDto } from './count';

export type Ack<T> = (reply: { data: T } | { error: string; details?: { path: string; message: string }[] }) => void;

export interface ClockSample {
  /** The client's send time, echoed back so the client can measure the round trip. */
  clientSentAt: number;
  serverAt: number;
}

export interface ClientToServerEvents {
  'clock:sync': (payload: { clientSentAt: number }, ack: Ack<ClockSample>) => void;
  /** Watch a count: the events after `sinceSeq` and the state they fold to; then `count:event` facts follow. */
  /** `state` on a first join (sinceSeq 0), or when the events sent stop short of it; null on a rejoin that the events bring up to date. */
  'count:join': (payload: { countId: number; sinceSeq: number }, ack: Ack<{ events: CountEventDto[]; state: CountStateDto | null }>) => void;
  'count:leave': (payload: { countId: number }) => void;
  /** The events the command appended, or the refusal in words. */
  'count:command': (payload: { countId: number; command: CountCommandInput }, ack: Ack<{ events: CountEventDto[] }>) => void;
}

export interface ServerToClientEvents {
  'session:ended': (payload: { reason: string }) => void;
  /**
   * Stored events of a count this socket has joined, in seq order: what one commit (or several at the same
   * moment) stored, sent as one message so a poll's answers do not cost a message per answer per phone.
   */
  'count:events': (events: CountEventDto[]) => void;
}

export interface SocketData {
  userId: number;
  /** The express-session id the socket was opened with, so signing out closes it. */
  sid: string;
}

export const clockSyncSchema = z.strictObject({ clientSentAt: z.number().finite() });

/**
 * Every client-to-server event with the schema its payload must pass and whether it is acknowledged. The type
 * makes a new event without an entry here a compile error; the handlers validate with these schemas and the
 * security suite fuzzes every event of this table.
 */
export const CLIENT_EVENTS = {
  'clock:sync': { schema: clockSyncSchema, ack: true },
  'count:join': { schema: countJoinSchema, ack: true },
  'count:leave': { schema: countLeaveSchema, ack: false },
  'count:command': { schema: countCommandPayloadSchema, ack: true },
} as const satisfies Record<keyof ClientToServerEvents, { schema: ZodType; ack: boolean }>;
