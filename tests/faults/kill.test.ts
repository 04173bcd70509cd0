import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Socket } from 'socket.io-client';
import sqlite3 from 'sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import type { CountEventDto } from '../../src/contract/count';
import { verifyChain } from '../../src/domain/count/chain';
import type { CountEvent } from '../../src/domain/count/events';
import { replay } from '../../src/domain/count/reduce';
import { parseExport } from '../../server/counts/export';
import { sha256Hex } from '../../server/counts/log';
import { DEMO } from '../helpers/api';
import { connected, openSocket } from '../helpers/counts';
import { bundleServer, freePort, killServer, signIn, startServer, type ServerProcess } from '../helpers/server-process';
import { seededRandom } from '../../src/domain/seeded-random';

/**
 * The server process is killed with SIGKILL at a random moment of a scripted count, again and again, and started
 * on the same database each time. Three crew members drive the count over real sockets (polls, NO-GOs, holds,
 * clears, resumes; answers to one poll sent at once, so they share group commits), and every event they were
 * acknowledged or sent is written down. After each restart:
 *
 * - the count's exported log verifies with the same check as `npm run verify-log` (parseExport + verifyChain);
 * - every acknowledged or broadcast event is in it, with the same hash;
 * - a count that was counting when the server died is holding, "control server restarted", its clock stopped;
 *   one that was holding is still holding, with no restart hold added;
 * - the commands that were in flight, sent again with their command ids, answer what was stored for them (the
 *   first answer) or are decided afresh, and no command id ever has two sets of events.
 *
 * FAULTS_SEED=<n> replays a run; FAULTS_TRIALS=<n> changes the number of kills (20 by default).
 */
const TRIALS = Number(process.env.FAULTS_TRIALS ?? 20);
const SEED = Number(process.env.FAULTS_SEED ?? Math.floor(Math.random() * 2 ** 31));
/** The kill lands up to this long after the count has started, at random (ms). */
const KILL_WITHIN_MS = 700;

type Reply = { data?: { events: CountEventDto[] }; error?: string };
type Who = 'tc' | 'prop' | 'pad';

function dbAll<R>(file: string, sql: string, params: unknown[]): Promise<R[]> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, sqlite3.OPEN_READONLY, (error) => {
      if (error) return reject(error);
      db.all(sql, params, (e: Error | null, rows: R[]) => db.close(() => (e ? reject(e) : resolve(rows))));
    });
  });
}

describe(`the server killed at random points of a count (seed ${SEED})`, () => {
  const dir = mkdtempSync(path.join(tmpdir(), 'holdfire-faults-kill-'));
  const file = path.join(dir, 'holdfire.sqlite');
  let server: ServerProcess | null = null;
  const spawned: ServerProcess[] = [];
  afterAll(async () => {
    await Promise.all(spawned.map(killServer));
    rmSync(dir, { recursive: true, force: true });
  });

  it(`keeps every acknowledged event over ${TRIALS} kills, the chain intact, counting counts holding`, { timeout: 150_000 }, async () => {
    console.log(`faults/kill: seed ${SEED} (FAULTS_SEED=${SEED} repeats this run), ${TRIALS} trials`);
    const random = seededRandom(SEED);
    const port = await freePort();
    const entry = await bundleServer(mkdtempSync(path.join(dir, 'bundle-')));
    const base = `http://127.0.0.1:${port}`;
    server = startServer(dir, port, {}, { standby: true, entry });
    spawned.push(server);
    server.go();
    await server.ready;
    // Sessions live in the database, so these cookies hold across every restart.
    const people = {
      tc: await signIn(base, DEMO.conductor),
      prop: await signIn(base, DEMO.propellants),
      pad: await signIn(base, DEMO.pad),
    };
    const auditor = await signIn(base, DEMO.auditor);
    const proc = await people.tc.get('/api/procedures/1').expect(200);
    const revisionId = proc.body.revisions.find((r: { status: string }) => r.status === 'released').id;
    const startMs: number[] = [];
    const outcomes = { ready: 0, counting: 0, holding: 0, inflightStored: 0, inflightNotStored: 0 };

    const standby = () => {
      const p = startServer(dir, port, {}, { standby: true, entry });
      spawned.push(p);
      return p;
    };
    // Loading the server's modules is most of a start-up (seconds on a busy machine): two processes load ahead.
    const waiting = [standby(), ...(TRIALS > 1 ? [standby()] : [])];
    const mark = (what: string) => process.env.FAULTS_VERBOSE && console.log(`${Math.round(performance.now())} ${what}`);
    for (let trial = 1; trial <= TRIALS; trial++) {
      mark(`trial ${trial}`);
      const id = (await people.tc.post('/api/counts', { procedureId: 1, revisionId, name: `Kill trial ${trial}` }).expect(201)).body.id as number;
      const sockets = {} as Record<Who, Socket>;
      for (const who of ['tc', 'prop', 'pad'] as const) {
        sockets[who] = openSocket(base, people[who].cookie);
        await connected(sockets[who]);
        const joined = await sockets[who].timeout(5000).emitWithAck('count:join', { countId: id, sinceSeq: 0 });
        expect(joined.data, JSON.stringify(joined)).toBeTruthy();
      }
      const seen = new Map<number, string>(); // seq -> hash, from acknowledgements and broadcasts
      for (const s of Object.values(sockets)) s.on('count:events', (list: CountEventDto[]) => list.forEach((e) => seen.set(e.seq, e.hash)));
      const sent = new Map<string, { who: Who; command: Record<string, unknown> }>();
      const answered = new Map<string, CountEventDto[]>();
      let dead = false;
      let n = 0;
      const send = async (who: Who, command: Record<string, unknown>): Promise<CountEventDto[] | null> => {
        if (dead) return null;
        const commandId = `t${trial}-${++n}`;
        sent.set(commandId, { who, command });
        let reply: Reply;
        try {
          reply = await sockets[who].timeout(3000).emitWithAck('count:command', { countId: id, command: { ...command, commandId } as never });
        } catch {
          dead = true; // the server is gone: no answer
          return null;
        }
        if (reply.error) {
          if (dead) return null;
          throw new Error(`trial ${trial}: ${who} ${JSON.stringify(command)} refused: ${reply.error}`);
        }
        answered.set(commandId, reply.data!.events);
        for (const e of reply.data!.events) seen.set(e.seq, e.hash);
        return reply.data!.events;
      };
      const payloadOf = (events: CountEventDto[] | null, type: string) => events?.find((e) => e.type === type)?.payload as Record<string, string> | undefined;

      // The script: rounds of the count's ordinary work until the server dies under it.
      let markStarted = () => {};
      const startedOrDead = new Promise<void>((resolve) => (markStarted = resolve));
      const script = async () => {
        const start = await send('tc', { type: 'count:start' });
        markStarted();
        if (!start) return;
        while (!dead) {
          const round = random();
          if (round < 0.45) {
            const opened = payloadOf(await send('tc', { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600 }), 'poll:opened');
            if (!opened) return;
            const nogo = random() < 0.3;
            const answers = await Promise.all([
              send('prop', { type: 'poll:answer', pollId: opened.pollId, station: 'PROP', answer: 'go' }),
              send('pad', nogo ? { type: 'poll:answer', pollId: opened.pollId, station: 'PAD', answer: 'nogo', reason: 'Igniter continuity out of band' } : { type: 'poll:answer', pollId: opened.pollId, station: 'PAD', answer: 'go' }),
            ]);
            const hold = answers.map((a) => payloadOf(a, 'hold:called')).find(Boolean);
            if (nogo) {
              if (!hold) return;
              if (!(await send('tc', { type: 'hold:clear', holdId: hold.holdId }))) return;
              if (!(await send('tc', { type: 'count:resume' }))) return;
            }
          } else {
            const who = random() < 0.5 ? 'prop' : 'pad';
            const hold = payloadOf(await send(who, { type: 'hold:call', category: 'hardware', reason: `Trial ${trial}: valve position disagrees` }), 'hold:called');
            if (!hold) return;
            if (!(await send(who, { type: 'hold:clear', holdId: hold.holdId }))) return;
            if (!(await send('tc', { type: 'count:resume' }))) return;
          }
        }
      };
      // The next server process has loaded its modules meanwhile; it opens the database only after the kill.
      mark('joined');
      const next = waiting.shift()!;
      await next.loaded;
      mark('standby loaded');
      const ran = script();
      // One kill in ten lands while the start itself is on its way; the others at a random moment after it.
      if (random() >= 0.1) await startedOrDead;
      const killAfter = Math.floor(random() * KILL_WITHIN_MS);
      await new Promise((resolve) => setTimeout(resolve, killAfter));
      await killServer(server);
      dead = true;
      await ran;
      for (const s of Object.values(sockets)) s.disconnect();

      // What the database held when the server died (opening it recovers the write-ahead log as a restart would).
      const [{ last }] = await dbAll<{ last: number }>(file, 'SELECT MAX(seq) AS last FROM count_events WHERE count_id = ?', [id]);

      mark('killed');
      const started = performance.now();
      server = next;
      server.go();
      await server.ready;
      startMs.push(performance.now() - started);
      if (trial + waiting.length < TRIALS) waiting.push(standby());

      mark('restarted');
      const exported = await auditor.get(`/api/counts/${id}/export?format=jsonl`).expect(200);
      const events = parseExport(exported.text, `count-${id}-log.jsonl`);
      const verdict = await verifyChain(events, sha256Hex);
      expect(verdict, `trial ${trial} (kill after ${killAfter} ms)`).toEqual({ ok: true, count: events.length });
      const stored = new Map(events.map((e) => [e.seq, e.hash]));
      const missing = [...seen].filter(([seq, hash]) => stored.get(seq) !== hash);
      expect(missing, `trial ${trial}: acknowledged or broadcast events missing after the restart`).toEqual([]);

      const before = replay(events.filter((e) => e.seq <= last) as unknown as CountEvent[]);
      const added = events.filter((e) => e.seq > last);
      const restartHolds = added.filter((e) => e.type === 'hold:called' && (e.payload as { source?: string }).source === 'restart');
      const state = (await auditor.get(`/api/counts/${id}/state`).expect(200)).body;
      expect(state.clock.running, `trial ${trial}`).toBe(false);
      if (before.status === 'counting') {
        outcomes.counting += 1;
        expect(restartHolds).toHaveLength(1);
        expect(state.status).toBe('holding');
        expect(state.hold).toMatchObject({ source: 'restart', reason: 'control server restarted' });
      } else {
        // Killed before the start was stored (still ready) or while holding: it stays as it was.
        outcomes[before.status === 'ready' ? 'ready' : 'holding'] += 1;
        expect(['ready', 'holding'], `trial ${trial}: the count was ${before.status} when killed`).toContain(before.status);
        expect(restartHolds).toEqual([]);
        expect(state.status).toBe(before.status);
      }

      mark('checked');
      // The commands that had no answer, sent again with their ids (as a client does once it is back).
      const retry = [...sent].filter(([commandId]) => !answered.has(commandId));
      const lastAnswered = [...answered.keys()].at(-1);
      if (lastAnswered) retry.push([lastAnswered, sent.get(lastAnswered)!]);
      const again = {} as Record<Who, Socket>;
      for (const who of ['tc', 'prop', 'pad'] as const) {
        again[who] = openSocket(base, people[who].cookie);
        await connected(again[who]);
      }
      const storedBefore = await dbAll<{ command_id: string; seq: number; hash: string }>(file, 'SELECT command_id, seq, hash FROM count_events WHERE count_id = ? AND command_id IS NOT NULL', [id]);
      for (const [commandId, { who, command }] of retry) {
        const reply: Reply = await again[who].timeout(5000).emitWithAck('count:command', { countId: id, command: { ...command, commandId } as never });
        const first = storedBefore.filter((r) => r.command_id === commandId).map((r) => ({ seq: r.seq, hash: r.hash }));
        if (first.length > 0) {
          outcomes.inflightStored += answered.has(commandId) ? 0 : 1;
          expect(reply.data?.events.map((e) => ({ seq: e.seq, hash: e.hash })), `trial ${trial}: retry of ${commandId}`).toEqual(first);
        } else {
          outcomes.inflightNotStored += 1;
          // Decided afresh on the count as it is now: stored once, or refused in words.
          if (reply.error) expect(reply.error).toMatch(/\w+ \w+/);
        }
      }
      for (const s of Object.values(again)) s.disconnect();
      const ids = await dbAll<{ command_id: string; n: number; lo: number; hi: number }>(
        file,
        'SELECT command_id, COUNT(*) AS n, MIN(seq) AS lo, MAX(seq) AS hi FROM count_events WHERE count_id = ? AND command_id IS NOT NULL GROUP BY command_id',
        [id],
      );
      // One command's events are one run of consecutive seqs: a second run would mean it acted twice.
      expect(ids.filter((r) => r.hi - r.lo + 1 !== r.n), `trial ${trial}`).toEqual([]);
    }

    // Every count of every trial, after all the restarts, still verifies.
    const list = (await auditor.get('/api/counts').expect(200)).body as { id: number; name: string }[];
    for (const c of list.filter((x) => x.name.startsWith('Kill trial '))) {
      expect((await auditor.get(`/api/counts/${c.id}/verify`).expect(200)).body, c.name).toMatchObject({ ok: true });
    }
    const sorted = [...startMs].sort((a, b) => a - b);
    console.log(
      `faults/kill: ${TRIALS} kills; counting when killed ${outcomes.counting}, holding ${outcomes.holding}, not started ${outcomes.ready}; in-flight commands found stored ${outcomes.inflightStored}, not stored ${outcomes.inflightNotStored}; restart (database open to listening) median ${Math.round(sorted[sorted.length >> 1]!)} ms, max ${Math.round(sorted.at(-1)!)} ms`,
    );
    // The random kill points must have hit both states, or the trials proved less than they claim.
    expect(outcomes.counting).toBeGreaterThan(0);
  });
});
