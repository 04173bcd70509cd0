/**
 * The typed socket.io event map both sides import. Commands go client -> server and may be acknowledged
 * with `{ data } | { error, details }`; facts go server -> client, named in the past tense.
 */
export type Ack<T> = (reply: { data: T } | { error: string; details?: { path: string; message: string }[] }) => void;

export interface ClockSample {
  /** The client's send time, echoed back so the client can measure the round trip. */
  clientSentAt: number;
  serverAt: number;
}

export interface ClientToServerEvents {
  'clock:sync': (payload: { clientSentAt: number }, ack: Ack<ClockSample>) => void;
}

export interface ServerToClientEvents {
  'session:ended': (payload: { reason: string }) => void;
}

export interface SocketData {
  userId: number;
  /** The express-session id the socket was opened with, so signing out closes it. */
  sid: string;
}
