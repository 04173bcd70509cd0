import fc from 'fast-check';
import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { CountEvent as CountEventRow, User } from '../../server/models';
import { countCommandSchema } from '../../src/contract/count';
import { CLIENT_EVENTS } from '../../src/contract/socket';
import { DEMO_PASSWORD } from '../../server/db/seed';
import { DEMO, createUser } from '../helpers/api';
import { demoRevision } from '../helpers/counts';
import { caller, check, fieldNames, nastyValue, snapshot, startSecurityApp, type Caller } from './support';

/**
 * Every client-to-server event of the contract's table (CLIENT_EVENTS): fuzzed payloads are refused in words,
 * in time, and change nothing; and who may act is checked event by event: watchers (an auditor, a signed-in
 * person on no station) cannot act, and an operator cannot act for a station they do not man.
 */
const t = await startSecurityApp();
afterAll(() => t.stop());

const RUNS = Number(process.env.HOLDFIRE_FUZZ_RUNS ?? 6);
const EVENTS = Object.entries(CLIENT_EVENTS) as [keyof typeof CLIENT_EVENTS, (typeof CLIENT_EVENTS)[keyof typeof CLIENT_EVENTS]][];
type Reply = { data?: unknown; error?: string; details?: unknown };

const sockets: Socket[] = [];
afterEach(() => {
  for (const s of sockets.splice(0)) s.disconnect();
});

function open(cookie: string): Socket {
  const s = connect(t.url, { transports: ['websocket'], reconnection: false, forceNew: true, timeout: 3000, extraHeaders: cookie ? { cookie } : {} });
  sockets.push(s);
  return s;
}

async function socketOf(c: Caller): Promise<Socket> {
  const s = open(c.cookie);
  await new Promise<void>((resolve, reject) => {
    s.once('connect', () => resolve());
    s.once('connect_error', reject);
  });
  return s;
}

/** Emits and waits for the acknowledgement (3 s: a hang fails), or for a round trip when the event has none. */
async function emit(s: Socket, event: string, payload: unknown, ack: boolean): Promise<Reply | undefined> {
  if (ack) return (await s.timeout(3000).emitWithAck(event as never, payload as never)) as Reply;
  s.emit(event as never, payload as never);
  // Events of one socket are handled in order: the clock's answer comes after the event above was handled.
  const sync = (await s.timeout(3000).emitWithAck('clock:sync', { clientSentAt: 1 })) as Reply;
  expect(sync.data).toBeDefined();
  return undefined;
}

const logLength = (countId: number) => CountEventRow.count({ where: { countId } });
/**
 * Events a person caused in a count, presence aside: a live count also appends on its own (steps reached as
 * time passes, stations lost after their grace time), so "the log did not grow" is asked per person.
 */
const actedBy = async (countId: number, c: Caller) => {
  const userId = (await User.findOne({ where: { email: c.email! } }))!.id;
  const rows = await CountEventRow.findAll({ where: { countId, actorUserId: userId } });
  return rows.filter((e) => !e.type.startsWith('station:')).length;
};

let conductor: Caller;
let readyCountId: number;
beforeAll(async () => {
  conductor = await caller(t, DEMO.conductor);
  const rev = await demoRevision({ get: (url: string) => conductor.agent.get(url) } as never);
  const res = await conductor.agent.post('/api/counts').set('X-CSRF-Token', conductor.csrf).send({ ...rev, name: 'Fuzzed count' }).expect(201);
  readyCountId = res.body.id;
  // A new count mails its crew after answering; let that finish before comparing snapshots.
  await t.holdfire.notifier.settle();
});

describe('fuzzed socket payloads', () => {
  it('the table names every event the server listens to', () => {
    expect(EVENTS.map(([name]) => name).sort()).toEqual(['clock:sync', 'count:command', 'count:join', 'count:leave']);
  });

  it.each(EVENTS.map(([name, spec]) => [name, spec] as const))('%s', async (name, spec) => {
    const s = await socketOf(conductor);
    // The count's real id is among the values, so a payload can name a real count and still be wrong elsewhere.
    const keys = fieldNames(spec.schema);
    const payload = fc
      .oneof(
        nastyValue([...keys, ...fieldNames(countCommandSchema)]),
        fc.record({ countId: fc.constant(readyCountId), command: nastyValue(fieldNames(countCommandSchema)) }, { requiredKeys: ['countId'] }),
        fc.constantFrom(undefined, null, 0, 'count', [readyCountId], { countId: readyCountId, sinceSeq: -1 }),
      )
      .filter((p) => !spec.schema.safeParse(p).success);
    await check(
      payload,
      async (p) => {
        const before = await snapshot(t);
        const reply = await emit(s, name, p, spec.ack);
        if (spec.ack) {
          expect(reply?.data, JSON.stringify(reply)).toBeUndefined();
          expect(typeof reply?.error).toBe('string');
          expect(reply!.error!.length).toBeGreaterThan(0);
        }
        expect(s.connected).toBe(true);
        expect(await snapshot(t)).toEqual(before);
      },
      RUNS * 2,
    );
  });

  it('an acknowledged event sent without a callback is ignored and changes nothing', async () => {
    const s = await socketOf(conductor);
    const before = await logLength(readyCountId);
    for (const [name, spec] of EVENTS) if (spec.ack) s.emit(name as never, { countId: readyCountId, sinceSeq: 0, command: { type: 'count:start' } } as never);
    await emit(s, 'count:leave', { countId: readyCountId }, false);
    expect(await logLength(readyCountId)).toEqual(before);
  });

  it('raw packets that are not valid socket.io leave the server serving and the database as it was', async () => {
    const before = await snapshot(t);
    const raws = [
      `42["count:command",{"countId":${readyCountId},"command":{"type":"count:start","fromSeconds":1e400}}]`,
      `421["count:command",{"countId":${readyCountId},"command":{"type":"count:start","fromSeconds":-0}}]`,
      `422["count:join",{"countId":1e400,"sinceSeq":-1e400}]`,
      '42["count:command"',
      '42[]',
      '42[1,2,3]',
      '42["__proto__",{"countId":1}]',
      '42["constructor",{}]',
      '42["count:join",{"__proto__":{"countId":1},"sinceSeq":0}]',
      '4',
      '49',
      '42' + '['.repeat(5000),
      '\u0000\uD800',
    ];
    for (const raw of raws) {
      const s = await socketOf(conductor);
      (s.io.engine as unknown as { send(data: string): void }).send(raw);
      await new Promise((r) => setTimeout(r, 20));
    }
    // A fresh socket still gets answers, and nothing was written.
    const s = await socketOf(conductor);
    const sync = (await s.timeout(3000).emitWithAck('clock:sync', { clientSentAt: 5 })) as Reply;
    expect(sync.data).toMatchObject({ clientSentAt: 5 });
    expect(await snapshot(t)).toEqual(before);
  });
});

describe('who may use each event', () => {
  let liveId: number;
  let pollId: string;
  let people: Record<'conductor' | 'prop' | 'pad' | 'auditor' | 'visitor' | 'admin' | 'safety', Caller>;
  let stepOf: (station: string) => string;

  beforeAll(async () => {
    const visitor = await createUser({ name: 'Wren Calloway', roles: ['operator'], password: DEMO_PASSWORD });
    people = {
      conductor,
      prop: await caller(t, DEMO.propellants),
      pad: await caller(t, DEMO.pad),
      auditor: await caller(t, DEMO.auditor),
      visitor: await caller(t, visitor.email),
      admin: await caller(t, DEMO.admin),
      safety: await caller(t, DEMO.safety),
    };
    const rev = await demoRevision({ get: (url: string) => conductor.agent.get(url) } as never);
    const res = await conductor.agent.post('/api/counts').set('X-CSRF-Token', conductor.csrf).send({ ...rev, name: 'Matrix count' }).expect(201);
    liveId = res.body.id;
    const steps = res.body.state.plan.steps as { key: string; station: string }[];
    stepOf = (station) => steps.find((s) => s.station === station)!.key;
    const tc = await socketOf(conductor);
    expect(((await tc.timeout(3000).emitWithAck('count:command', { countId: liveId, command: { type: 'count:start' } })) as Reply).data).toBeDefined();
    const opened = (await tc.timeout(3000).emitWithAck('count:command', {
      countId: liveId,
      command: { type: 'poll:open', stations: ['PROP', 'PAD'], timeoutSeconds: 3600 },
    })) as { data: { events: { type: string; payload: { pollId: string } }[] } };
    pollId = opened.data.events.find((e) => e.type === 'poll:opened')!.payload.pollId;
  });

  it('a signed-out socket is refused at the door', async () => {
    const s = open('');
    const error = await new Promise<Error>((resolve) => s.once('connect_error', resolve));
    expect(error.message).toBe('Sign in to connect.');
  });

  it('every person may sync the clock, join a count of their team and leave it', async () => {
    for (const c of Object.values(people)) {
      const s = await socketOf(c);
      expect(((await emit(s, 'clock:sync', { clientSentAt: 1 }, true)) as Reply).data).toBeDefined();
      const joined = (await emit(s, 'count:join', { countId: liveId, sinceSeq: 0 }, true)) as Reply;
      expect(joined.error, c.email!).toBeUndefined();
      await emit(s, 'count:leave', { countId: liveId }, false);
    }
  });

  /** A valid command of each type, aimed where the caller has no business: another station, no station. */
  const sample = (type: string): Record<string, unknown> => {
    const samples: Record<string, Record<string, unknown>> = {
      'count:start': {},
      'poll:open': { stations: ['PAD'], timeoutSeconds: 60 },
      'poll:answer': { pollId, station: 'PAD', answer: 'go' },
      'hold:call': { category: 'other', reason: 'Looks wrong from here', station: 'PAD' },
      'hold:clear': { holdId: 'H1' },
      'count:resume': {},
      'count:recycle': { reason: 'Again' },
      'count:scrub': { category: 'other', reason: 'Enough' },
      'step:complete': { stepKey: stepOf('PAD') },
      'reading:record': { stepKey: stepOf('PAD'), value: 1 },
      'builtInHold:release': {},
      'count:complete': {},
      'count:close-safing': {},
    };
    expect(samples[type], `a sample command for ${type}`).toBeDefined();
    return { type, ...samples[type] };
  };
  const commandTypes = countCommandSchema.options.map((o) => (o.shape.type as unknown as { value: string }).value);

  it.each(['auditor', 'visitor', 'prop'] as const)('%s: every command type is refused and the log does not grow', async (who) => {
    const s = await socketOf(people[who]);
    const before = await actedBy(liveId, people[who]);
    for (const type of commandTypes) {
      const command = sample(type);
      expect(countCommandSchema.safeParse(command).success, type).toBe(true);
      const reply = (await emit(s, 'count:command', { countId: liveId, command }, true)) as Reply;
      expect(reply.error, `${who} ${type}`).toEqual(expect.any(String));
      expect(reply.error, `${who} ${type}`).not.toMatch(/could not do that/);
    }
    if (who !== 'prop') {
      const hold = (await emit(s, 'count:command', { countId: liveId, command: { type: 'hold:call', category: 'other', reason: 'Watching' } }, true)) as Reply;
      expect(hold.error).toBe('Only the crew can call a hold: you are watching this count.');
    }
    expect(await actedBy(liveId, people[who])).toEqual(before);
  });

  it('the refusals name the station rule: an operator answering, calling a hold or completing a step for another station', async () => {
    const s = await socketOf(people.prop);
    const send = async (command: object) => ((await emit(s, 'count:command', { countId: liveId, command }, true)) as Reply).error;
    expect(await send(sample('poll:answer'))).toMatch(/belongs to PAD; you man PROP/);
    expect(await send(sample('hold:call'))).toBe('You do not man PAD in this count.');
    expect(await send(sample('step:complete'))).toMatch(/belongs to PAD; you man PROP/);
    const watcher = await socketOf(people.auditor);
    const answer = (await emit(watcher, 'count:command', { countId: liveId, command: { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' } }, true)) as Reply;
    expect(answer.error).toMatch(/you man no station in this count/);
  });

  it('the same person answers for their own station (the refusals above are about the station, not the path)', async () => {
    const s = await socketOf(people.prop);
    const before = await actedBy(liveId, people.prop);
    const reply = (await emit(s, 'count:command', { countId: liveId, command: { type: 'poll:answer', pollId, station: 'PROP', answer: 'go' } }, true)) as Reply;
    expect(reply.error).toBeUndefined();
    expect(await actedBy(liveId, people.prop)).toBeGreaterThan(before);
  });

  it('conductor-only commands are refused to the admin and the safety officer where the domain says so', async () => {
    for (const who of ['admin', 'safety'] as const) {
      const s = await socketOf(people[who]);
      for (const type of ['poll:open', 'count:resume', 'count:recycle', 'builtInHold:release', 'count:complete']) {
        const reply = (await emit(s, 'count:command', { countId: liveId, command: sample(type) }, true)) as Reply;
        expect(reply.error, `${who} ${type}`).toMatch(/^Only the test conductor/);
      }
    }
  });
});
