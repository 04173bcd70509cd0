import { z } from 'zod';
import { idParamSchema } from '../../src/contract/hazards';
import {
  countCommandSchema,
  countCreateInputSchema,
  type CountDetailDto,
  type CountEventDto,
  type CountStateDto,
  type CountSummaryDto,
} from '../../src/contract/count';
import type { CountCommand } from '../../src/domain/count/commands';
import type { EventDraft } from '../../src/domain/count/events';
import { stateAt } from '../../src/domain/count/reduce';
import { countReport } from '../../src/domain/count/report';
import { tAt, type CountState } from '../../src/domain/count/state';
import type { CountService } from '../counts/service';
import { toCsv, toJsonl } from '../counts/export';
import type { ChainedEvent } from '../../src/domain/count/chain';
import { badRequest, conflict, HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import type { Notifier } from '../mail/notify';
import { countScheduledNotice } from '../mail/templates';
import { Count, Procedure, ProcedureRevision, User } from '../models';
import { countableRevision } from '../procedures/countable';
import { buildCountPlan } from '../counts/plan';
import { findProcedure, revisionsOf } from '../procedures/procedures';

const stateQuerySchema = z.strictObject({
  at: z
    .string()
    .regex(/^\d{1,15}$/, 'Give the instant as epoch milliseconds')
    .transform(Number)
    .optional(),
});
const eventsQuerySchema = z.strictObject({
  sinceSeq: z
    .string()
    .regex(/^\d{1,9}$/, 'Give a sequence number')
    .transform(Number)
    .optional(),
});

const exportQuerySchema = z.strictObject({
  format: z.enum(['jsonl', 'csv'], 'Choose format=jsonl or format=csv').default('jsonl'),
});

/** The state with its clock read at `now`, so a client that never saw the anchor reads the same T. */
export function stateDto(state: CountState, now: number): CountStateDto {
  return { ...state, clock: { ...state.clock, tSeconds: tAt(state, now), anchorAt: state.clock.running ? now : state.clock.anchorAt } };
}

function summary(row: Count, state: CountState, procedureName: string, createdBy: { userId: number; name: string }): CountSummaryDto {
  const plan = state.plan;
  const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
  return {
    id: row.id,
    name: row.name,
    procedureId: row.procedureId as number,
    procedureName,
    revisionNumber: plan?.revisionNumber ?? 0,
    status: state.status,
    createdBy,
    createdAt: row.createdAt.toISOString(),
    startedAt: iso(state.startedAt),
    t0At: iso(state.t0At),
    closedAt: iso(state.closedAt),
    windowEnd: iso(plan?.windowEnd ?? null),
    reportAt: iso(row.reportAt ?? null),
  };
}

export function countRoutes({ counts, notifier }: { counts: CountService; notifier: Notifier }) {
  async function detail(teamId: number, row: Count): Promise<CountDetailDto> {
    const live = await counts.get(teamId, row.id);
    const [procedure, creator] = await Promise.all([
      Procedure.findByPk(row.procedureId as number, { attributes: ['name'] }),
      row.createdById ? User.findByPk(row.createdById as number, { attributes: ['id', 'name'] }) : null,
    ]);
    const now = Date.now();
    return {
      ...summary(row, live.state, procedure?.name ?? '', { userId: creator?.id ?? 0, name: creator?.name ?? '' }),
      state: stateDto(live.state, now),
    };
  }

  async function findCount(teamId: number, id: number): Promise<Count> {
    const row = await Count.findOne({ where: { id, teamId } });
    if (!row) throw notFound('There is no such count.');
    return row;
  }

  return [
    route({
      method: 'get',
      path: '/counts',
      access: 'signed-in',
      handler: async ({ user }): Promise<CountSummaryDto[]> => {
        const rows = await Count.findAll({ where: { teamId: user!.teamId }, order: [['id', 'DESC']] });
        const out: CountSummaryDto[] = [];
        for (const row of rows) {
          const d = await detail(user!.teamId, row);
          const { state: _state, ...rest } = d;
          out.push(rest);
        }
        return out;
      },
    }),
    route({
      method: 'post',
      path: '/counts',
      access: ['conductor', 'admin'],
      status: 201,
      body: countCreateInputSchema,
      handler: async ({ body, user }): Promise<CountDetailDto> => {
        const teamId = user!.teamId;
        const p = await findProcedure(teamId, body.procedureId);
        const rev = revisionsOf(p).find((r) => r.id === body.revisionId);
        if (!rev) throw badRequest('That revision is not one of this procedure’s.', 'validation_failed', [{ path: 'revisionId', message: 'Not a revision of this procedure.' }]);
        await countableRevision(teamId, p.id, rev.number);

        const { plan, windowEnd } = await buildCountPlan(teamId, p, rev, body);

        const reportAt = body.reportAt ? Date.parse(body.reportAt) : null;
        const row = await Count.create({ teamId, procedureId: p.id, revisionId: rev.id, name: body.name, windowEnd, reportAt, createdById: user!.id });
        const created: EventDraft = { type: 'count:created', payload: plan, actor: { userId: user!.id, name: user!.name }, station: null };
        await counts.start(row.id, created);
        notifier.notify(
          'count-scheduled',
          plan.crew.flatMap((c) => c.userIds),
          (u) => countScheduledNotice({ plan, userId: u.id, conductor: user!.name, reportAt, windowEnd, link: `${notifier.appUrl}/counts/${row.id}` }),
        );
        return detail(teamId, row);
      },
    }),
    route({
      method: 'get',
      path: '/counts/:id',
      access: 'signed-in',
      params: idParamSchema,
      handler: async ({ params, user }) => detail(user!.teamId, await findCount(user!.teamId, params.id)),
    }),
    route({
      method: 'get',
      path: '/counts/:id/state',
      access: 'signed-in',
      params: idParamSchema,
      query: stateQuerySchema,
      handler: async ({ params, query, user }): Promise<CountStateDto> => {
        const teamId = user!.teamId;
        await findCount(teamId, params.id);
        if (query.at === undefined) return stateDto((await counts.get(teamId, params.id)).state, Date.now());
        const events = await counts.eventsSince(teamId, params.id, 0);
        return stateDto(stateAt(events, query.at), query.at);
      },
    }),
    route({
      method: 'get',
      path: '/counts/:id/events',
      access: 'signed-in',
      params: idParamSchema,
      query: eventsQuerySchema,
      handler: async ({ params, query, user }): Promise<CountEventDto[]> => {
        await findCount(user!.teamId, params.id);
        return counts.eventsSince(user!.teamId, params.id, query.sinceSeq ?? 0);
      },
    }),
    route({
      method: 'get',
      path: '/counts/:id/report',
      access: 'signed-in',
      params: idParamSchema,
      handler: async ({ params, user }) => {
        const row = await findCount(user!.teamId, params.id);
        const events = await counts.eventsSince(user!.teamId, params.id, 0);
        return { countId: params.id, countName: row.name, ...countReport(events as unknown as Parameters<typeof countReport>[0]) };
      },
    }),
    route({
      method: 'get',
      path: '/counts/:id/verify',
      access: 'signed-in',
      params: idParamSchema,
      handler: async ({ params, user }) => {
        await findCount(user!.teamId, params.id);
        const verdict = await counts.verify(user!.teamId, params.id);
        return verdict;
      },
    }),
    route({
      method: 'get',
      path: '/counts/:id/export',
      access: 'signed-in',
      params: idParamSchema,
      query: exportQuerySchema,
      handler: async ({ params, query, user, res }) => {
        await findCount(user!.teamId, params.id);
        const events = await counts.eventsSince(user!.teamId, params.id, 0);
        const chained = events.map((e) => ({ ...e, actor: e.actor ? { userId: e.actor.userId, name: e.actor.name } : null }));
        const csv = query.format === 'csv';
        res.setHeader('Content-Type', csv ? 'text/csv; charset=utf-8' : 'application/jsonl; charset=utf-8');
        res.setHeader('Content-Disposition', `attachment; filename="count-${params.id}-log.${csv ? 'csv' : 'jsonl'}"`);
        res.setHeader('Cache-Control', 'no-store');
        res.send(csv ? toCsv(chained as ChainedEvent[]) : toJsonl(chained as ChainedEvent[]));
      },
    }),
    route({
      method: 'post',
      path: '/counts/:id/commands',
      access: 'signed-in',
      params: idParamSchema,
      body: countCommandSchema,
      handler: async ({ params, body, user }): Promise<{ events: CountEventDto[] }> => {
        const u = user!;
        await findCount(u.teamId, params.id);
        const events = await counts.command(u.teamId, params.id, { id: u.id, teamId: u.teamId, name: u.name, roles: u.roles }, body as CountCommand & { commandId?: string });
        return { events };
      },
    }),
  ];
}

export { conflict, HttpError, ProcedureRevision };
