/**
 * Ends sessions that must not live on: the sockets of a signed-out session, and every stored session
 * and socket of a person deactivated, or whose password was changed or reset elsewhere.
 * Routes are built before socket.io exists, so the server is attached once it does.
 */
import { Op } from 'sequelize';
import { Session } from '../models/session.model';
import type { HoldfireServer } from '../realtime/types';

export const sessionRoom = (sid: string) => `session:${sid}`;
export const userRoom = (userId: number) => `user:${userId}`;

export interface SessionEnder {
  attach(io: HoldfireServer): void;
  /** Tells the sockets of one session why they are closed, then closes them. */
  endSessionSockets(sid: string, reason: string): void;
  /** Closes every socket of one person (they may reconnect if still signed in). */
  endUserSockets(userId: number, reason: string): void;
  /** Deletes the user's stored sessions (but `keepSid`) and closes their sockets. Returns how many sessions ended. */
  endUserSessions(userId: number, reason: string, keepSid?: string): Promise<number>;
}

function sessionUserId(data: string | null): number | null {
  if (!data) return null;
  try {
    const parsed = JSON.parse(data) as { passport?: { user?: unknown } };
    const id = parsed.passport?.user;
    return typeof id === 'number' ? id : typeof id === 'string' && /^\d+$/.test(id) ? Number(id) : null;
  } catch {
    return null;
  }
}

export function createSessionEnder(): SessionEnder {
  let io: HoldfireServer | null = null;

  const close = (room: string, reason: string, keepSid?: string) => {
    if (!io) return;
    for (const socket of io.sockets.sockets.values()) {
      if (!socket.rooms.has(room) || (keepSid && socket.data.sid === keepSid)) continue;
      socket.emit('session:ended', { reason });
      socket.disconnect(true);
    }
  };

  return {
    attach(server) {
      io = server;
    },
    endSessionSockets(sid, reason) {
      close(sessionRoom(sid), reason);
    },
    endUserSockets(userId, reason) {
      close(userRoom(userId), reason);
    },
    async endUserSessions(userId, reason, keepSid) {
      // Session data is JSON text written by express-session; a team has few rows, so read and match.
      const rows = await Session.findAll({ where: keepSid ? { sid: { [Op.ne]: keepSid } } : {} });
      const ended = rows.filter((r) => sessionUserId(r.data) === userId).map((r) => r.sid);
      if (ended.length > 0) await Session.destroy({ where: { sid: ended } });
      close(userRoom(userId), reason, keepSid);
      return ended.length;
    },
  };
}
