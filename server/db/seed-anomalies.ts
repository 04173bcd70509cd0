import type { Transaction } from 'sequelize';
import { anomalyRef } from '../../src/contract/anomalies';
import { BUILT_IN_MATRIX_ID } from '../../src/contract/hazards';
import type { CountEvent as CountEventData } from '../../src/domain/count/events';
import { instantOf, severityLabel, tText } from '../anomalies/anomalies';
import { toStored } from '../counts/log';
import { hazardCode } from '../hazards/hazards';
import { defaultMatrixId, resolveMatrix } from '../hazards/matrices';
import { Anomaly, AnomalyHazard, AnomalyHistory, CorrectiveAction, Count, CountEvent, Hazard, HazardHistory, type Team, type User } from '../models';

/** The demo hazard the demo anomaly is linked to (server/db/seed-hazards.ts). */
export const DEMO_SURGE_HAZARD_TITLE = 'Fuel surge at main-valve opening into a hot regen jacket';

const SAFETY = 'Priya Halloran';
const CONDUCTOR = 'Marek Lindqvist';
const PROPELLANTS = 'Tomasz Reyes';
const PAD = 'Aiko Brennan';

/**
 * An invented anomaly for the demo: a pressure surge at the Kestrel-2 fuel inlet that tripped a redline hold in a
 * count at Marsh End, linked to the demo surge hazard, with one corrective action done and one still open.
 * `at` is an instant of the count's log (the redline hold); T there is computed from the log like any report.
 */
export async function seedDemoAnomalies(args: {
  countId: number;
  at: number;
  users: User[];
  team: Pick<Team, 'id'>;
  transaction?: Transaction;
}): Promise<Anomaly> {
  const { countId, at, users, team, transaction } = args;
  const byName = (name: string) => {
    const u = users.find((x) => x.name === name);
    if (!u) throw new Error(`seedDemoAnomalies: the demo user ${name} is missing`);
    return u;
  };
  const [safety, conductor, propellants, pad] = [byName(SAFETY), byName(CONDUCTOR), byName(PROPELLANTS), byName(PAD)];
  const count = await Count.findOne({ where: { id: countId, teamId: team.id }, transaction });
  if (!count) throw new Error(`seedDemoAnomalies: no count ${countId} in team ${team.id}`);
  const rows = await CountEvent.findAll({ where: { countId }, order: [['seq', 'ASC']], transaction });
  const events = rows.map(toStored) as unknown as CountEventData[];
  const instant = instantOf(events, at, at);

  const matrixId = await defaultMatrixId(team.id, transaction);
  const m = await resolveMatrix(team.id, matrixId, transaction);
  // Critical on the built-in matrix; on a team matrix, its second-worst severity.
  const severity = matrixId === BUILT_IN_MATRIX_ID ? '2' : (m.matrix.severities[1] ?? m.matrix.severities[0]!).key;
  const last = (await Anomaly.max('number', { where: { teamId: team.id }, transaction })) as number | null;
  // The record is dated after the count as a team would have kept it: reported 20 minutes after the hold, the hazard
  // linked and the actions added the next day, the first action done two days later (never later than now).
  const after = (minutes: number) => new Date(Math.min(at + minutes * 60_000, Date.now()));
  const REPORTED = 20;
  const NEXT_DAY = 24 * 60;
  const DONE = 3 * 24 * 60 - 90;

  const a = await Anomaly.create(
    {
      teamId: team.id,
      number: (last ?? 0) + 1,
      title: 'Pressure surge at the Kestrel-2 fuel inlet tripped a redline',
      description:
        'During the terminal count the fuel inlet pressure transducer read a sharp spike above its redline as the fuel ' +
        'pre-valve was cycled. The count went into a redline hold. The run tank pressure stayed steady, so the spike was ' +
        'at the inlet: a surge in the long fuel line when the valve moved quickly.',
      immediateActions: 'Hold kept; fuel pre-valve closed and the line vented; the stand was made safe before anyone approached it.',
      matrixId,
      severity,
      countId,
      at,
      tSeconds: instant.tSeconds,
      countStatus: instant.countStatus,
      reportedById: conductor.id,
      closedAt: null,
      closedById: null,
      createdAt: after(REPORTED),
      updatedAt: after(DONE),
    },
    { transaction },
  );
  const ref = anomalyRef(a.number);
  const say = (who: User, minutes: number, text: string) =>
    AnomalyHistory.create({ anomalyId: a.id, userId: who.id, userName: who.name, text, createdAt: after(minutes) }, { transaction });
  await say(conductor, REPORTED, `Reported ${ref} “${a.title}” in the count “${count.name}” at ${tText(instant.tSeconds) ?? 'an instant before it started'}, severity ${severityLabel(m, severity)}.`);

  const hazard = await Hazard.findOne({ where: { teamId: team.id, title: DEMO_SURGE_HAZARD_TITLE }, transaction });
  if (hazard) {
    await AnomalyHazard.create({ anomalyId: a.id, hazardId: hazard.id, createdById: safety.id, createdAt: after(NEXT_DAY) }, { transaction });
    await say(safety, NEXT_DAY, `Linked the hazard ${hazardCode(hazard.number)} “${hazard.title}”.`);
    await HazardHistory.create(
      { hazardId: hazard.id, userId: safety.id, userName: safety.name, field: 'anomaly', before: null, after: `${ref} ${a.title}`, createdAt: after(NEXT_DAY) },
      { transaction },
    );
  }

  const day = (offset: number) => new Date(at + offset * 86_400_000).toISOString().slice(0, 10);
  const done = await CorrectiveAction.create(
    {
      anomalyId: a.id,
      description: 'Check the inlet transducer against the reference gauge and re-zero it.',
      ownerId: pad.id,
      dueDate: day(3),
      status: 'done',
      createdAt: after(NEXT_DAY + 10),
      updatedAt: after(DONE),
    },
    { transaction },
  );
  await say(safety, NEXT_DAY + 10, `Added the corrective action “${done.description}”, owner ${pad.name}, due ${done.dueDate}, open.`);
  const open = await CorrectiveAction.create(
    {
      anomalyId: a.id,
      description: 'Slow the fuel pre-valve actuation and add the valve timing to the procedure.',
      ownerId: propellants.id,
      dueDate: day(14),
      status: 'open',
      createdAt: after(NEXT_DAY + 20),
      updatedAt: after(NEXT_DAY + 20),
    },
    { transaction },
  );
  await say(safety, NEXT_DAY + 20, `Added the corrective action “${open.description}”, owner ${propellants.name}, due ${open.dueDate}, open.`);
  await say(pad, DONE, `Marked the corrective action “${done.description}” done (was open).`);
  return a;
}
