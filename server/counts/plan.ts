/**
 * The plan a count freezes in its `count:created` event: the revision's steps with their cautions as signed at
 * release and each station's PPE, the crew, the safing phases and the count's settings. Used by `POST /api/counts`
 * and by the demo seed, so a demo count is made exactly as a real one.
 */
import type { Transaction } from 'sequelize';
import type { CountCreateInput } from '../../src/contract/count';
import type { CountPlan, CrewStation } from '../../src/domain/count/events';
import {
  buildPlanSteps,
  DEFAULT_POLL_TIMEOUT_SECONDS,
  DEFAULT_RECYCLE_TO_SECONDS,
  DEFAULT_TERMINAL_COUNT_SECONDS,
  defaultStartT,
  guessSafingPhaseKeys,
  type PhaseWithCautions,
} from '../../src/domain/count/plan';
import type { ResolvedCaution } from '../../src/domain/procedures/cautions';
import { badRequest } from '../http/errors';
import { CrewAssignment, CrewPlan, Station, User, type Procedure, type ProcedureRevision } from '../models';
import { cautionContext, currentCautions } from '../procedures/procedures';

/** The newest crew plan for this procedure, else the newest for a test day, else the team's newest. */
export async function crewFromPlan(teamId: number, procedureId: number, transaction?: Transaction): Promise<{ station: string; userIds: number[] }[]> {
  const plans = await CrewPlan.findAll({
    where: { teamId },
    include: [{ model: CrewAssignment, as: 'assignments', include: [{ model: Station, as: 'station' }] }],
    order: [['id', 'DESC']],
    transaction,
  });
  const plan = plans.find((p) => p.procedureId === procedureId) ?? plans.find((p) => p.procedureId === null) ?? plans[0];
  if (!plan) return [];
  const by = new Map<string, number[]>();
  for (const a of plan.assignments ?? []) by.set(a.station!.code, [...(by.get(a.station!.code) ?? []), a.userId]);
  return [...by].map(([station, userIds]) => ({ station, userIds }));
}

export type CountPlanInput = Omit<CountCreateInput, 'procedureId' | 'revisionId'>;

/** The plan for a count of `rev`, or a 400 naming every station, person or phase that does not fit. */
export async function buildCountPlan(
  teamId: number,
  p: Procedure,
  rev: ProcedureRevision,
  input: CountPlanInput,
  transaction?: Transaction,
): Promise<{ plan: CountPlan; windowEnd: number | null }> {
  const stations = await Station.findAll({ where: { teamId }, transaction });
  const known = new Map(stations.map((s) => [s.code, s]));
  const crewInput = input.crew ?? (await crewFromPlan(teamId, p.id, transaction));
  const problems: { path: string; message: string }[] = [];
  const people = await User.findAll({ where: { teamId, active: true }, attributes: ['id', 'name'], transaction });
  const nameOf = new Map(people.map((u) => [u.id, u.name]));
  crewInput.forEach((c, i) => {
    if (!known.has(c.station)) problems.push({ path: `crew.${i}.station`, message: `There is no station with the short code ${c.station}.` });
    c.userIds.forEach((id, j) => {
      if (!nameOf.has(id)) problems.push({ path: `crew.${i}.userIds.${j}`, message: 'Not an active member of your team.' });
    });
  });
  if (problems.length) throw badRequest('Some of the crew cannot be put on this count.', 'validation_failed', problems);
  const crew: CrewStation[] = crewInput.map((c) => ({ station: c.station, userIds: c.userIds, names: c.userIds.map((id) => nameOf.get(id)!) }));

  const phaseKeys = rev.phases.map((ph) => ph.key);
  const safing = input.safingPhaseKeys ?? guessSafingPhaseKeys(rev.phases);
  safing.forEach((k, i) => {
    if (!phaseKeys.includes(k)) problems.push({ path: `safingPhaseKeys.${i}`, message: `There is no phase ${k} in this revision.` });
  });
  if (problems.length) throw badRequest('Some phases are not in this revision.', 'validation_failed', problems);

  // The cautions as signed at release (a propellant's PPE is among them, as a note), and the station's own PPE.
  const signed: Record<string, ResolvedCaution[]> = rev.releasedCautions ?? currentCautions(rev.phases, await cautionContext(teamId, transaction));
  const phases: PhaseWithCautions[] = rev.phases.map((ph) => ({
    ...ph,
    steps: ph.steps.map((st) => ({ ...st, cautions: signed[st.key] ?? [], ppe: [...(known.get(st.station)?.defaultPpe ?? [])] })),
  }));
  const steps = buildPlanSteps(phases);
  const windowEnd = input.windowEnd ? Date.parse(input.windowEnd) : null;
  const plan: CountPlan = {
    name: input.name,
    procedureId: p.id,
    revisionId: rev.id,
    revisionNumber: rev.number,
    steps,
    safingPhaseKeys: safing,
    crew,
    terminalCountSeconds: input.terminalCountSeconds ?? DEFAULT_TERMINAL_COUNT_SECONDS,
    recycleToSeconds: input.recycleToSeconds ?? DEFAULT_RECYCLE_TO_SECONDS,
    windowEnd,
    pollTimeoutSeconds: input.pollTimeoutSeconds ?? DEFAULT_POLL_TIMEOUT_SECONDS,
    startTSeconds: defaultStartT(steps, safing),
  };
  return { plan, windowEnd };
}
