/**
 * The typed socket.io event map both sides import. Commands go client -> server and may be acknowledged
 * with `{ data } | { error, details }`; facts go server -> client, named in the past tense.
 */
import type { CountCommandInput, CountEventDto, CountStateDto } from './count';

export type Ack<T> = (reply: { data: T } | { error: string; details?: { path: string; message: string }[] }) => void;

export interface ClockSample {
  /** The client's send time, echoed back so the client can measure the round trip. */
  clientSentAt: number;
  serverAt: number;
}

export interface ClientToServerEvents {
  'clock:sync': (payload: { clientSentAt: number }, ack: Ack<ClockSample>) => void;
  /** Watch a count: the events after `sinceSeq` and the state they fold to; then `count:event` facts follow. */
  'count:join': (payload: { countId: number; sinceSeq: number }, ack: Ack<{ events: CountEventDto[]; state: CountStateDto }>) => void;
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
