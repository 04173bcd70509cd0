import { io, type Socket } from 'socket.io-client';
import type { ClientToServerEvents, ServerToClientEvents } from '../contract/socket';

/**
 * The one socket.io connection of the app: same origin, authenticated by the session cookie. Features take it
 * from `getSocket()`; tests put a fake in its place with `setSocketFactory`.
 */
export type HoldfireSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

// WebSocket first, long-polling only where a WebSocket cannot be opened: starting on polling and upgrading costs
// twice the server memory per phone and can lose a polling request in the upgrade.
const realFactory = (): HoldfireSocket => io({ withCredentials: true, transports: ['websocket', 'polling'], tryAllTransports: true });

let factory: () => HoldfireSocket = realFactory;
let shared: HoldfireSocket | null = null;

export function getSocket(): HoldfireSocket {
  shared ??= factory();
  return shared;
}

/** Close the shared connection (sign-out, session ended); the next getSocket() opens a new one. */
export function closeSocket(): void {
  shared?.disconnect();
  shared = null;
}

/** For tests: every later getSocket() builds its socket with `make` (or the real one again when omitted). */
export function setSocketFactory(make?: () => HoldfireSocket): void {
  shared = null;
  factory = make ?? realFactory;
}
