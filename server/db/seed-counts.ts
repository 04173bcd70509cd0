/**
 * Three demo counts of the Kestrel-2 static fire at Marsh End, run through the same domain functions as a live
 * count (src/domain/count/simulate.ts) and written as hash-chained logs, as the server would have written them:
 * - static fire 1: the wind reading crosses its redline at the start and the count is scrubbed for weather;
 * - static fire 2: fired, after two holds (a walker on the footpath, a recorder fault) and a recycle from the
 *   terminal count (an igniter continuity fault on the firing box);
 * - static fire 3: the fuel run-tank pressure crosses its redline during pressurisation; the hold is cleared after
 *   venting back into the band and the engine is fired. That reading becomes the demo anomaly.
 * Every event, person and value is invented for the demo.
 */
import type { Transaction } from 'sequelize';
import { canonicalJson, eventHash, GENESIS_HASH } from '../../src/domain/count/chain';
import type { CountEvent as DomainEvent } from '../../src/domain/count/events';
import { countReport, type CountReport } from '../../src/domain/count/report';
import { CountSimulation, inLimitsValue, type SimPerson } from '../../src/domain/count/simulate';
import { openHolds } from '../../src/domain/count/state';
import { parseTMinus } from '../../src/domain/procedures/tminus';
import { sha256Hex } from '../counts/log';
import { buildCountPlan } from '../counts/plan';
import { Count, CountEvent, Procedure, type User } from '../models';
import { findProcedure, latestReleasedNumber, findRevision } from '../procedures/procedures';

export interface DemoCounts {
  scrubbed: { countId: number };
  completed: { countId: number; t0At: number; report: CountReport };
  redline: { countId: number; t0At: number; redlineAt: number };
}

const T = (text: string): number => {
  const t = parseTMinus(text);
  if (t === undefined) throw new Error(`demo count: bad time ${text}`);
  return t;
};

async function writeLog(countId: number, events: readonly DomainEvent[], transaction: Transaction): Promise<void> {
  let prevHash = GENESIS_HASH;
  const rows = [];
  for (const e of events) {
    const payload = JSON.parse(canonicalJson(e.payload)) as unknown;
    const content = { countId, seq: e.seq, type: e.type, at: e.at, actor: e.actor === null ? null : { userId: e.actor.userId, name: e.actor.name }, station: e.station, payload };
    const hash = await eventHash(prevHash, content, sha256Hex);
    rows.push({
      countId,
      seq: e.seq,
      type: e.type,
      payload,
      actorUserId: e.actor?.userId ?? null,
      actorName: e.actor?.name ?? null,
      station: e.station,
      at: e.at,
      commandId: null,
      prevHash,
      hash,
    });
    prevHash = hash;
  }
  await CountEvent.bulkCreate(rows, { transaction });
}

/** Adds the three demo counts after the procedures and crew plan; returns what the demo anomaly and data need. */
export async function seedDemoCounts(teamId: number, users: User[], transaction: Transaction): Promise<DemoCounts> {
  const procedure = await Procedure.findOne({ where: { teamId }, order: [['id', 'ASC']], transaction });
  if (!procedure) throw new Error('demo counts: seed the procedure first');
  const p = await findProcedure(teamId, procedure.id, transaction);
  const rev = findRevision(p, latestReleasedNumber(p)!);
  const byName = (name: string) => {
    const u = users.find((x) => x.name === name);
    if (!u) throw new Error(`demo counts: no user ${name}`);
    return u;
  };
  const conductorUser = byName('Marek Lindqvist');

  async function count(name: string, createdAt: string, script: (sim: CountSimulation, crew: Map<string, SimPerson>) => void) {
    const { plan } = await buildCountPlan(teamId, p, rev, { name }, transaction);
    const crew = new Map<string, SimPerson>();
    for (const station of plan.crew) {
      for (const [i, userId] of station.userIds.entries()) {
        const u = users.find((x) => x.id === userId)!;
        const person = crew.get(u.name) ?? { userId, name: station.names[i]!, roles: [...u.roles], mans: [] };
        person.mans.push(station.station);
        crew.set(u.name, person);
      }
    }
    const created = Date.parse(createdAt);
    const sim = new CountSimulation(plan, { userId: conductorUser.id, name: conductorUser.name }, created);
    script(sim, crew);
    const row = await Count.create(
      {
        teamId,
        procedureId: p.id,
        revisionId: rev.id,
        name,
        windowEnd: null,
        createdById: conductorUser.id,
        status: sim.state.status,
        createdAt: new Date(created),
        updatedAt: new Date(sim.now),
      },
      { transaction, silent: true },
    );
    await writeLog(row.id, sim.events, transaction);
    return { row, sim };
  }

  const who = (crew: Map<string, SimPerson>, name: string) => crew.get(name)!;
  const secs = (n: number) => n * 1000;
  /** Safing: the crew does every safing step, the conductor opens each safing poll, then closes safing. */
  const safeTheStand = (sim: CountSimulation, crew: Map<string, SimPerson>) => {
    const people = [...crew.values()];
    const tc = who(crew, 'Marek Lindqvist');
    for (let round = 0; round < 40 && sim.state.status === 'safing'; round++) {
      sim.crewUntil(sim.now + secs(90), people);
      const safingPoll = sim.state.plan!.steps.find((s) => s.kind === 'poll' && sim.state.steps[s.key]?.status === 'current');
      if (safingPoll && !sim.state.poll) sim.ok(tc, { type: 'poll:open', stepKey: safingPoll.key }, sim.now + secs(20));
      const open = sim.state.plan!.steps.filter((s) => sim.state.steps[s.key]?.status === 'current');
      if (open.length === 0 && !sim.state.poll) sim.ok(tc, { type: 'count:close-safing' }, sim.now + secs(60));
    }
  };

  // Static fire 1: scrubbed for wind.
  const scrubbed = await count('Kestrel-2 static fire 1', '2025-05-17T07:35:00Z', (sim, crew) => {
    const people = [...crew.values()];
    sim.connect(people, Date.parse('2025-05-17T07:50:00Z'));
    sim.ok(who(crew, 'Marek Lindqvist'), { type: 'count:start' }, Date.parse('2025-05-17T08:00:00Z'));
    // The wind at the mast is read above its limit: the reading holds the count by itself.
    sim.crewToT(T('T-1:55:00'), people);
    sim.crewUntil(sim.now + secs(40), people, { readingFor: (s) => (s.key === 'wind' ? 12.5 : inLimitsValue(s)) }, (st) => st.status === 'holding');
    // The crew finishes what it can while the wind is watched; two more readings stay above the limit.
    sim.crewUntil(sim.now + secs(15 * 60), people, { skip: ['wind'] });
    sim.ok(who(crew, 'Priya Halloran'), { type: 'reading:record', stepKey: 'wind', value: 11.8 }, sim.now + secs(30));
    sim.crewUntil(sim.now + secs(20 * 60), people, { skip: ['wind'] });
    sim.ok(who(crew, 'Priya Halloran'), { type: 'reading:record', stepKey: 'wind', value: 12.9 }, sim.now + secs(30));
    sim.ok(
      who(crew, 'Priya Halloran'),
      { type: 'count:scrub', category: 'weather', reason: 'Wind at the stand mast 11.8 to 12.9 m/s for 35 minutes against a 10 m/s limit; the forecast keeps it above the limit until the window closes.' },
      sim.now + secs(120),
    );
    safeTheStand(sim, crew);
  });

  // Static fire 2: two holds and a recycle, then fired.
  const completed = await count('Kestrel-2 static fire 2', '2025-05-31T06:20:00Z', (sim, crew) => {
    const people = [...crew.values()];
    const tc = who(crew, 'Marek Lindqvist');
    sim.connect(people, Date.parse('2025-05-31T06:40:00Z'));
    sim.ok(tc, { type: 'count:start' }, Date.parse('2025-05-31T06:45:00Z'));
    sim.crewToT(T('T-23:40'), people);
    const range = who(crew, 'Dev Castellano');
    sim.ok(range, { type: 'hold:call', category: 'range', reason: 'Walker with a dog on the footpath at the north gate, heading for the keep-out area.', station: 'RANGE' }, sim.now);
    sim.crewUntil(sim.now + secs(7 * 60 + 20), people);
    sim.ok(range, { type: 'hold:clear', holdId: openHolds(sim.state)[0]!.holdId }, sim.now);
    sim.ok(tc, { type: 'count:resume' }, sim.now + secs(25));
    sim.crewToT(T('T-7:10'), people);
    const data = who(crew, 'Noor Fairweather');
    sim.ok(data, { type: 'hold:call', category: 'hardware', reason: 'Stand recorder stopped writing: memory card full. Swapping the card.', station: 'DATA' }, sim.now);
    sim.crewUntil(sim.now + secs(9 * 60 + 5), people);
    sim.ok(data, { type: 'hold:clear', holdId: openHolds(sim.state)[0]!.holdId }, sim.now);
    sim.ok(tc, { type: 'count:resume' }, sim.now + secs(30));
    sim.crewToT(T('T-0:41'), people);
    const pad = who(crew, 'Aiko Brennan');
    sim.ok(pad, { type: 'hold:call', category: 'hardware', reason: 'Firing box shows an open igniter circuit after arming.', station: 'PAD' }, sim.now);
    sim.crewUntil(sim.now + secs(4 * 60), people);
    sim.ok(
      tc,
      { type: 'count:recycle', reason: 'Hold inside the terminal count: disarm, safe the firing box, reseat the igniter connector at the stand with the tanks vented to 5 bar, recount from T-10:00.' },
      sim.now,
    );
    sim.crewUntil(sim.now + secs(14 * 60), people);
    sim.ok(pad, { type: 'hold:clear', holdId: openHolds(sim.state)[0]!.holdId }, sim.now);
    sim.ok(tc, { type: 'count:resume' }, sim.now + secs(40));
    sim.crewToT(T('T+0:50'), people);
    sim.crewUntil(sim.now + secs(20), people);
    sim.ok(tc, { type: 'count:complete' }, sim.now + secs(5));
    safeTheStand(sim, crew);
  });

  // Static fire 3: the fuel run-tank pressure crosses its redline during pressurisation.
  let redlineAt = 0;
  const redline = await count('Kestrel-2 static fire 3', '2025-06-14T06:30:00Z', (sim, crew) => {
    const people = [...crew.values()];
    const tc = who(crew, 'Marek Lindqvist');
    sim.connect(people, Date.parse('2025-06-14T06:50:00Z'));
    sim.ok(tc, { type: 'count:start' }, Date.parse('2025-06-14T07:00:00Z'));
    sim.crewToT(T('T-15:00'), people);
    sim.crewUntil(sim.now + secs(90), people, { skip: ['fuel-pressure'] });
    const data = who(crew, 'Noor Fairweather');
    sim.ok(data, { type: 'reading:record', stepKey: 'fuel-pressure', value: 36.4 }, sim.now);
    redlineAt = sim.now;
    sim.crewUntil(sim.now + secs(11 * 60), people, { skip: ['fuel-pressure'] });
    sim.ok(data, { type: 'reading:record', stepKey: 'fuel-pressure', value: 33.2 }, sim.now);
    sim.ok(who(crew, 'Priya Halloran'), { type: 'hold:clear', holdId: openHolds(sim.state)[0]!.holdId }, sim.now + secs(45));
    sim.ok(tc, { type: 'count:resume' }, sim.now + secs(30));
    sim.crewToT(T('T+0:50'), people);
    sim.crewUntil(sim.now + secs(20), people);
    sim.ok(tc, { type: 'count:complete' }, sim.now + secs(5));
    safeTheStand(sim, crew);
  });

  const t0 = (sim: CountSimulation) => {
    if (sim.state.t0At === null) throw new Error('demo count: never reached T-0');
    return sim.state.t0At;
  };
  return {
    scrubbed: { countId: scrubbed.row.id },
    completed: { countId: completed.row.id, t0At: t0(completed.sim), report: countReport(completed.sim.events) },
    redline: { countId: redline.row.id, t0At: t0(redline.sim), redlineAt },
  };
}
