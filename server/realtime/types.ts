import type { Server, Socket } from 'socket.io';
import type { ClientToServerEvents, ServerToClientEvents, SocketData } from '../../src/contract/socket';

export type HoldfireServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;
export type HoldfireSocket = Socket<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;
