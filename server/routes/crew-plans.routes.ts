import type { z } from 'zod';
import type { Transaction } from 'sequelize';
import { idParamSchema } from '../../src/contract/hazards';
import { crewPlanInputSchema, manningQuerySchema, type CrewPersonDto, type CrewPlanDto, type ManningDto } from '../../src/contract/procedures';
import { manningCheck, neededStations } from '../../src/domain/procedures/manning';
import { badRequest, notFound } from '../http/errors';
import { route } from '../http/route';
import { CrewAssignment, CrewPlan, Procedure, Station, User } from '../models';
import { findProcedure, findRevision, latestReleasedNumber, revisionsOf, stationsOf, tx } from '../procedures/procedures';

/** Crew plans are the test conductor's (or an admin's) to make. */
const WRITERS = ['admin', 'conductor'] as const;

const PLAN_INCLUDE = [
  { model: CrewAssignment, as: 'assignments', include: [{ model: Station, as: 'station' }, { model: User, as: 'user' }] },
  { model: Procedure, as: 'procedure' },
];

async function findPlan(teamId: number, id: number, transaction?: Transaction): Promise<CrewPlan> {
  const plan = await CrewPlan.findOne({ where: { id, teamId }, include: PLAN_INCLUDE, transaction });
  if (!plan) throw notFound('No such crew plan.');
  return plan;
}

function planDto(plan: CrewPlan): CrewPlanDto {
  return {
    id: plan.id,
    name: plan.name,
    procedureId: plan.procedureId,
    procedureName: plan.procedure?.name ?? null,
    testDate: plan.testDate,
    notes: plan.notes,
    assignments: [...(plan.assignments ?? [])]
      .sort((a, b) => a.id - b.id)
      .map((a) => ({
        stationId: a.stationId,
        stationCode: a.station!.code,
        stationName: a.station!.name,
        userId: a.userId,
        userName: a.user!.name,
        active: a.user!.active,
      })),
    createdAt: plan.createdAt.toISOString(),
    updatedAt: plan.updatedAt.toISOString(),
  };
}

type ParsedPlan = z.output<typeof crewPlanInputSchema>;

/** Refuses a procedure, station or person outside the team, a deactivated person, and a pair listed twice. */
async function checkPlan(teamId: number, body: ParsedPlan, t: Transaction): Promise<void> {
  const details: { path: string; message: string }[] = [];
  if (body.procedureId !== null && !(await Procedure.findOne({ where: { id: body.procedureId, teamId }, transaction: t }))) {
    details.push({ path: 'procedureId', message: 'There is no such procedure in your team.' });
  }
  const stations = new Map((await stationsOf(teamId, t)).map((s) => [s.id, s]));
  const users = new Map((await User.findAll({ where: { teamId }, transaction: t })).map((u) => [u.id, u]));
  const seen = new Set<string>();
  body.assignments.forEach((a, i) => {
    if (!stations.has(a.stationId)) details.push({ path: `assignments.${i}.stationId`, message: 'There is no such station in your team.' });
    const u = users.get(a.userId);
    if (!u) details.push({ path: `assignments.${i}.userId`, message: 'There is no such person in your team.' });
    else if (!u.active) details.push({ path: `assignments.${i}.userId`, message: `${u.name}'s account is deactivated.` });
    const pair = `${a.stationId}:${a.userId}`;
    if (seen.has(pair)) details.push({ path: `assignments.${i}`, message: 'This person is already assigned to this station.' });
    seen.add(pair);
  });
  if (details.length) throw badRequest('Some of the crew plan does not fit your team.', 'validation_failed', details);
}

async function writeAssignments(planId: number, assignments: ParsedPlan['assignments'], t: Transaction) {
  await CrewAssignment.destroy({ where: { crewPlanId: planId }, transaction: t });
  for (const a of assignments) await CrewAssignment.create({ crewPlanId: planId, stationId: a.stationId, userId: a.userId }, { transaction: t });
}

export function crewPlanRoutes() {
  return [
    route({
      method: 'get',
      path: '/crew-plans',
      access: 'signed-in',
      handler: async ({ user }) => {
        const plans = await CrewPlan.findAll({ where: { teamId: user!.teamId }, include: PLAN_INCLUDE, order: [['id', 'ASC']] });
        return plans.map(planDto);
      },
    }),
    route({
      // Who can be put on a crew: the team's active people. Listed before /crew-plans/:id so it is not read as an id.
      method: 'get',
      path: '/crew-plans/people',
      access: WRITERS,
      handler: async ({ user }): Promise<CrewPersonDto[]> => {
        const users = await User.findAll({ where: { teamId: user!.teamId, active: true }, order: [['name', 'ASC'], ['id', 'ASC']] });
        return users.map((u) => ({ id: u.id, name: u.name, roles: u.roles }));
      },
    }),
    route({
      method: 'get',
      path: '/crew-plans/:id',
      access: 'signed-in',
      params: idParamSchema,
      handler: async ({ params, user }) => planDto(await findPlan(user!.teamId, params.id)),
    }),
    route({
      method: 'post',
      path: '/crew-plans',
      access: WRITERS,
      status: 201,
      body: crewPlanInputSchema,
      handler: async ({ body, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          await checkPlan(teamId, body, t);
          const plan = await CrewPlan.create(
            { teamId, name: body.name, procedureId: body.procedureId, testDate: body.testDate, notes: body.notes },
            { transaction: t },
          );
          await writeAssignments(plan.id, body.assignments, t);
          return planDto(await findPlan(teamId, plan.id, t));
        });
      },
    }),
    route({
      method: 'put',
      path: '/crew-plans/:id',
      access: WRITERS,
      params: idParamSchema,
      body: crewPlanInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const plan = await findPlan(teamId, params.id, t);
          await checkPlan(teamId, body, t);
          plan.set({ name: body.name, procedureId: body.procedureId, testDate: body.testDate, notes: body.notes });
          await plan.save({ transaction: t });
          await writeAssignments(plan.id, body.assignments, t);
          return planDto(await findPlan(teamId, plan.id, t));
        });
      },
    }),
    route({
      method: 'delete',
      path: '/crew-plans/:id',
      access: WRITERS,
      params: idParamSchema,
      handler: async ({ params, user }) => {
        await tx(async (t) => {
          const plan = await findPlan(user!.teamId, params.id, t);
          await plan.destroy({ transaction: t });
        });
      },
    }),
    route({
      method: 'get',
      path: '/crew-plans/:id/manning',
      access: 'signed-in',
      params: idParamSchema,
      query: manningQuerySchema,
      handler: async ({ params, query, user }): Promise<ManningDto> => {
        const teamId = user!.teamId;
        const plan = await findPlan(teamId, params.id);
        const procedureId = query.procedureId ?? plan.procedureId;
        if (procedureId === null) {
          throw badRequest('This crew plan is for a test day, not one procedure: say which procedure to check.', 'procedure_required', [
            { path: 'procedureId', message: 'Choose a procedure.' },
          ]);
        }
        const p = await findProcedure(teamId, procedureId);
        const number = query.revision ?? latestReleasedNumber(p) ?? revisionsOf(p).at(-1)!.number;
        const rev = findRevision(p, number);
        const needed = neededStations(rev.phases, p.stations);
        const known = new Set((await stationsOf(teamId)).map((s) => s.code));
        const check = manningCheck(
          needed,
          (plan.assignments ?? []).map((a) => ({ station: a.station!.code, userId: a.userId, userName: a.user!.name, active: a.user!.active })),
        );
        return { ...check, crewPlanId: plan.id, procedureId: p.id, revisionNumber: rev.number, unknownStations: needed.filter((c) => !known.has(c)) };
      },
    }),
  ];
}
