import type { Server, Socket } from 'socket.io';
import type { ClientToServerEvents, ServerToClientEvents, SocketData } from '../../src/contract/socket';

/** Between Holdfire processes (through the Redis adapter): a count's log grew to lastSeq on another process. */
export interface InterServerEvents {
  'count:appended': (countId: number, lastSeq: number) => void;
}

export type HoldfireServer = Server<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>;
export type HoldfireSocket = Socket<ClientToServerEvents, ServerToClientEvents, InterServerEvents, SocketData>;
