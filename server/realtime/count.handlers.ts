import { CLIENT_EVENTS } from '../../src/contract/socket';
import type { CountCommand } from '../../src/domain/count/commands';
import type { Ack } from '../../src/contract/socket';
import { countRoom, type CountActor, type CountService } from '../counts/service';
import { HttpError, storageRefusal } from '../http/errors';
import { stateDto } from '../routes/counts.routes';
import type { Request } from 'express';
import type { HoldfireServer, HoldfireSocket } from './types';

type Issue = { path: PropertyKey[]; message: string };
const details = (issues: readonly Issue[]) => issues.map((i) => ({ path: i.path.map(String).join('.') || '(payload)', message: i.message }));

/** Only messages written for people go back; anything else is logged and answered in general words. */
function answerError(ack: Ack<never>, error: unknown, log: (m: string, e?: unknown) => void) {
  if (error instanceof HttpError) return ack({ error: error.message, details: error.details });
  log('count socket handler failed', error);
  // The log could not store the command (busy or full): say so, since nothing happened and a retry can work.
  const refusal = storageRefusal(error);
  if (refusal) return ack({ error: refusal.message });
  ack({ error: 'The server could not do that. Try again; if it keeps failing, tell the test conductor on the radio.' });
}

/**
 * A count over the socket: join (catch up from a seq, then receive every new event), leave, and commands,
 * which take the same path as POST /api/counts/:id/commands. The person is the one the session held when the
 * socket connected: a role change, a deactivation or a sign-out closes the socket (auth/session-ender.ts), so a
 * socket never acts with roles its person no longer has, and no command waits for a database read.
 */
export function registerCountHandlers(_io: HoldfireServer, socket: HoldfireSocket, counts: CountService, log: (m: string, e?: unknown) => void) {
  const joined = new Set<number>();

  async function person(): Promise<Express.User> {
    const u = (socket.request as Request).user;
    if (!u || !u.active || u.id !== socket.data.userId) throw new HttpError(401, 'unauthenticated', 'Sign in again to go on.');
    return u;
  }

  socket.on('count:join', async (payload, ack) => {
    if (typeof ack !== 'function') return;
    const parsed = CLIENT_EVENTS['count:join'].schema.safeParse(payload);
    if (!parsed.success) return ack({ error: 'count:join needs { countId, sinceSeq }.', details: details(parsed.error.issues) });
    try {
      const u = await person();
      const c = await counts.get(u.teamId, parsed.data.countId);
      await socket.join(countRoom(c.id));
      joined.add(c.id);
      const since = parsed.data.sinceSeq;
      const events = await counts.eventsSince(u.teamId, c.id, since);
      // The state only on a first join, or when events were committed after the read: a rejoin's catch-up is then
      // a few events, not the whole state (which holds every closed poll's answers and grows with the count).
      const reached = events.at(-1)?.seq ?? since;
      ack({ data: { events, state: since === 0 || reached < c.state.lastSeq ? stateDto(c.state, Date.now()) : null } });
      await counts.connect(c, socket.id, u.id);
    } catch (error) {
      answerError(ack, error, log);
    }
  });

  socket.on('count:leave', async (payload) => {
    const parsed = CLIENT_EVENTS['count:leave'].schema.safeParse(payload);
    if (!parsed.success) return;
    joined.delete(parsed.data.countId);
    await socket.leave(countRoom(parsed.data.countId));
    counts.disconnect(parsed.data.countId, socket.id);
  });

  /** Who acts, read from the session's user once: a change to the person closes the socket (see above). */
  let actor: CountActor | null = null;
  async function commander(): Promise<CountActor> {
    if (actor) return actor;
    const u = await person();
    actor = { id: u.id, teamId: u.teamId, name: u.name, roles: u.roles };
    return actor;
  }

  socket.on('count:command', async (payload, ack) => {
    if (typeof ack !== 'function') return;
    const parsed = CLIENT_EVENTS['count:command'].schema.safeParse(payload);
    if (!parsed.success) return ack({ error: 'That command is not valid.', details: details(parsed.error.issues) });
    try {
      const who = await commander();
      const events = await counts.command(who.teamId, parsed.data.countId, who, parsed.data.command as CountCommand & { commandId?: string });
      // Answered once the room has the events (a broadcast may wait for the commits behind it): the socket has
      // folded them in seq order when the answer names them, instead of seeing a gap before it.
      const last = events.at(-1);
      if (last) await counts.broadcasted(parsed.data.countId, last.seq);
      ack({ data: { events } });
    } catch (error) {
      answerError(ack, error, log);
    }
  });

  socket.on('disconnect', () => {
    for (const id of joined) counts.disconnect(id, socket.id);
    joined.clear();
  });
}
