import { io as connect, type Socket } from 'socket.io-client';
import type { TestClient } from './app';
import { createProcedure, put } from './procedures';

/**
 * A short procedure for counts that must reach T-0 within a test: from T-15 s, a reading with a redline at
 * T-14 s, a poll at T-12 s, T-0 and a safing phase. Released by the demo conductor and safety officer.
 */
export async function releasedShortProcedure(conductor: TestClient, safety: TestClient, name = `Short count ${Date.now()}`) {
  const p = await createProcedure(conductor, name);
  const content = {
    phases: [
      {
        name: 'Terminal count',
        steps: [
          { kind: 'action', tSeconds: -15, station: 'TC', instruction: 'Start the data recorders.' },
          { kind: 'reading', tSeconds: -14, station: 'PROP', instruction: 'LOX tank pressure', unit: 'bar', min: null, max: 14 },
          { kind: 'poll', tSeconds: -12, station: 'TC', instruction: 'Go for firing?', stations: ['PROP', 'PAD'] },
          { kind: 'action', tSeconds: 0, station: 'TC', instruction: 'Fire.' },
        ],
      },
      {
        name: 'Safing and detanking',
        steps: [{ kind: 'action', tSeconds: 5, station: 'PAD', instruction: 'Vent both tanks to 0 bar.' }],
      },
    ],
  };
  const saved = await put(conductor, `/api/procedures/${p.id}/revisions/1`, content);
  if (saved.status !== 200) throw new Error(`save: ${saved.status} ${JSON.stringify(saved.body)}`);
  await conductor.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'conductor' }).expect(201);
  const rev = await safety.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'safety' }).expect(201);
  return { procedureId: p.id as number, revisionId: rev.body.id as number };
}

/** A released procedure of three seconds: T-3 start the recorders (TC), T-2 pressurise (PROP), T-0 fire (TC). */
export async function releasedTinyProcedure(conductor: TestClient, safety: TestClient, name = `Tiny count ${Date.now()}`) {
  const p = await createProcedure(conductor, name);
  const content = {
    phases: [
      {
        name: 'Terminal count',
        steps: [
          { kind: 'action', tSeconds: -3, station: 'TC', instruction: 'Start the data recorders.' },
          { kind: 'action', tSeconds: -2, station: 'PROP', instruction: 'Pressurise the LOX tank.' },
          { kind: 'action', tSeconds: 0, station: 'TC', instruction: 'Fire.' },
        ],
      },
    ],
  };
  const saved = await put(conductor, `/api/procedures/${p.id}/revisions/1`, content);
  if (saved.status !== 200) throw new Error(`save: ${saved.status} ${JSON.stringify(saved.body)}`);
  await conductor.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'conductor' }).expect(201);
  const rev = await safety.post(`/api/procedures/${p.id}/revisions/1/signoffs`, { as: 'safety' }).expect(201);
  return { procedureId: p.id as number, revisionId: rev.body.id as number };
}

/** The demo procedure's released revision (procedure 1, revision 1). */
export async function demoRevision(c: TestClient) {
  const res = await c.get('/api/procedures/1').expect(200);
  const released = (res.body.revisions as { id: number; status: string }[]).find((r) => r.status === 'released')!;
  return { procedureId: 1, revisionId: released.id };
}

export function openSocket(url: string, cookie: string): Socket {
  return connect(url, { transports: ['websocket'], reconnection: false, forceNew: true, timeout: 3000, extraHeaders: { cookie } });
}

export async function connected(socket: Socket): Promise<void> {
  if (socket.connected) return;
  await new Promise<void>((resolve, reject) => {
    socket.once('connect', () => resolve());
    socket.once('connect_error', reject);
  });
}

/** Collects every event (count:events) a socket receives, and waits for one that matches. */
export function eventRecorder(socket: Socket) {
  const events: { seq: number; type: string; payload: Record<string, unknown>; station: string | null }[] = [];
  const waiters: { match: (e: (typeof events)[number]) => boolean; resolve: (e: (typeof events)[number]) => void }[] = [];
  socket.on('count:events', (list) => {
    for (const e of list) record(e);
  });
  function record(e: (typeof events)[number]) {
    events.push(e);
    for (const w of [...waiters]) {
      if (w.match(e)) {
        waiters.splice(waiters.indexOf(w), 1);
        w.resolve(e);
      }
    }
  }
  return {
    events,
    waitFor(match: (e: (typeof events)[number]) => boolean, timeoutMs = 10_000) {
      const seen = events.find(match);
      if (seen) return Promise.resolve(seen);
      return new Promise<(typeof events)[number]>((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error('no matching count:event arrived')), timeoutMs);
        waiters.push({ match, resolve: (e) => (clearTimeout(timer), resolve(e)) });
      });
    },
  };
}
