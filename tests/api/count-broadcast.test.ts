import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CountEventDto } from '../../src/contract/count';
import { CountService, type CountActor } from '../../server/counts/service';
import type { EventLog } from '../../server/counts/log';
import { User } from '../../server/models';
import { DEMO } from '../helpers/api';
import { startTestApp, type TestApp } from '../helpers/app';
import { demoRevision } from '../helpers/counts';

/**
 * How committed events reach the count's room: held back while more of the count's events are on their way to
 * the disk (a poll's answers committed in several groups go out as one message), but never longer than the
 * service's wait, and never at all before their own commit. The service here runs on the app's real event log
 * with a gate in front of it, so the test decides when each append may go on to its commit.
 */
let t: TestApp;
let teamId: number;
const actors = new Map<string, CountActor>();

beforeAll(async () => {
  t = await startTestApp();
  for (const email of [DEMO.conductor, DEMO.propellants, DEMO.pad]) {
    const u = (await User.findOne({ where: { email } }))!;
    actors.set(email, { id: u.id, teamId: u.teamId, name: u.name, roles: u.roles });
    teamId = u.teamId;
  }
});
afterAll(() => t.stop());

/** The real log, each append waiting at a gate the test opens (or fails) in turn; while `open`, appends pass. */
function gatedLog(real: EventLog) {
  type Waiting = { types: string[]; go: () => void; fail: (e: Error) => void };
  const waiting: Waiting[] = [];
  const arrived: (() => void)[] = [];
  const log = Object.create(real) as EventLog;
  const gate = {
    log,
    open: true,
    /** The oldest append still at the gate, once there is one. */
    async next(): Promise<Waiting> {
      while (waiting.length === 0) await new Promise<void>((resolve) => arrived.push(resolve));
      return waiting.shift()!;
    },
  };
  log.append = (countId, drafts) => {
    if (gate.open) return real.append(countId, drafts);
    return new Promise((resolve, reject) => {
      waiting.push({ types: drafts.map((d) => d.type), go: () => resolve(real.append(countId, drafts)), fail: reject });
      arrived.splice(0).forEach((f) => f());
    });
  };
  return gate;
}

async function setUp(coalesceMs: number) {
  const conductor = await t.client(DEMO.conductor);
  const rev = await demoRevision(conductor);
  const countId = (await conductor.post('/api/counts', { ...rev, name: `Broadcast ${Date.now()}` }).expect(201)).body.id as number;
  const gate = gatedLog(t.holdfire.eventLog);
  const batches: CountEventDto[][] = [];
  const arrivals: (() => void)[] = [];
  const service = new CountService({
    log: gate.log,
    broadcast: (_id, events) => {
      batches.push(events);
      arrivals.splice(0).forEach((f) => f());
    },
    coalesceMs,
  });
  const command = (email: string, c: object) => service.command(teamId, countId, actors.get(email)!, c as never);
  const nextBatch = () => new Promise<void>((resolve) => arrivals.push(resolve));
  await command(DEMO.conductor, { type: 'count:start' });
  const opened = await command(DEMO.conductor, { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 600 });
  const pollId = (opened.find((e) => e.type === 'poll:opened')!.payload as { pollId: string }).pollId;
  // The start and the poll go out before the answers; from here on every append waits at the gate.
  while (!batches.flat().some((e) => e.type === 'poll:opened')) await nextBatch();
  batches.length = 0;
  gate.open = false;
  return { service, gate, batches, nextBatch, command, pollId };
}

const answer = (pollId: string, station: string) => ({ type: 'poll:answer', pollId, station, answer: 'go' });
const turns = async (n: number) => {
  for (let i = 0; i < n; i++) await new Promise((resolve) => setImmediate(resolve));
};

describe('broadcasting committed events', () => {
  it('holds a committed answer back while the next is on its way to the disk, then sends both as one message', async () => {
    const { service, gate, batches, nextBatch, command, pollId } = await setUp(60_000);
    const first = command(DEMO.propellants, answer(pollId, 'PROP'));
    const firstAppend = await gate.next();
    const second = command(DEMO.pad, answer(pollId, 'PAD'));
    const secondAppend = await gate.next();
    expect([firstAppend.types, secondAppend.types]).toEqual([['poll:answered'], ['poll:answered', 'poll:closed']]);

    firstAppend.go();
    const firstEvents = await first;
    expect(firstEvents.map((e) => e.type)).toEqual(['poll:answered']);
    await turns(5);
    // Committed and answered, but the room hears nothing while the next answer is still uncommitted.
    expect(batches).toEqual([]);

    secondAppend.go();
    const secondEvents = await second;
    while (batches.length === 0) await nextBatch();
    expect(batches).toHaveLength(1);
    expect(batches[0]!.map((e) => e.type)).toEqual(['poll:answered', 'poll:answered', 'poll:closed']);
    expect(batches[0]!.map((e) => e.seq)).toEqual([...firstEvents, ...secondEvents].map((e) => e.seq));
    service.close();
  });

  it('sends a committed answer after the wait when the commit behind it takes longer', async () => {
    const { service, gate, batches, nextBatch, command, pollId } = await setUp(40);
    const first = command(DEMO.propellants, answer(pollId, 'PROP'));
    (await gate.next()).go();
    const second = command(DEMO.pad, answer(pollId, 'PAD'));
    const secondAppend = await gate.next();
    await first;
    // The second append stays at the gate: the first answer goes out by itself once it has waited 40 ms.
    while (batches.length === 0) await nextBatch();
    expect(batches.map((b) => b.map((e) => e.type))).toEqual([['poll:answered']]);
    expect(batches[0]![0]!.payload).toMatchObject({ station: 'PROP' });

    secondAppend.go();
    await second;
    while (batches.length < 2) await nextBatch();
    expect(batches[1]!.map((e) => e.type)).toEqual(['poll:answered', 'poll:closed']);
    service.close();
  });

  it('sends what was committed at once when the commit behind it fails', async () => {
    const { service, gate, batches, nextBatch, command, pollId } = await setUp(60_000);
    const first = command(DEMO.propellants, answer(pollId, 'PROP'));
    (await gate.next()).go();
    const second = command(DEMO.pad, answer(pollId, 'PAD'));
    const secondAppend = await gate.next();
    await first;
    await turns(5);
    expect(batches).toEqual([]);

    secondAppend.fail(new Error('disk gone'));
    await expect(second).rejects.toThrow('disk gone');
    while (batches.length === 0) await nextBatch();
    expect(batches.map((b) => b.map((e) => e.type))).toEqual([['poll:answered']]);
    service.close();
  });
});
