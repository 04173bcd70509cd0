import type { Transaction } from 'sequelize';
import {
  ACTION_STATUS_LABELS,
  anomalyActionParamSchema,
  anomalyAttachmentParamSchema,
  anomalyCreateInputSchema,
  anomalyHazardParamSchema,
  anomalyListQuerySchema,
  anomalyParamSchema,
  anomalyRef,
  anomalyUpdateInputSchema,
  attachmentFieldsSchema,
  closeInputSchema,
  correctiveActionInputSchema,
  correctiveActionUpdateInputSchema,
  hazardLinkInputSchema,
  lessonInputSchema,
  type ActionStatus,
  type AnomalyPersonDto,
  type LessonDto,
} from '../../src/contract/anomalies';
import { hazardCreateInputSchema } from '../../src/contract/hazards';
import type { CountEvent } from '../../src/domain/count/events';
import {
  anomalyDtoFor,
  checkSeverity,
  findAnomaly,
  instantOf,
  listAnomalies,
  matrixCache,
  say,
  severityLabel,
  summaryDto,
  tText,
  type Actor,
} from '../anomalies/anomalies';
import { notifyCorrectiveActionAssigned, type NotifyDeps } from '../anomalies/notify';
import type { CountService } from '../counts/service';
import { badRequest, conflict, HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import { createHazard, findHazard, hazardCode, hazardDtoFor, record } from '../hazards/hazards';
import { defaultMatrixId, resolveMatrix } from '../hazards/matrices';
import { Anomaly, AnomalyAttachment, AnomalyHazard, AnomalyRevision, CorrectiveAction, Count, User } from '../models';
import { findProcedure, openDraft, revisionsOf } from '../procedures/procedures';
import { acceptUpload, singleFileUpload, type UploadStore } from '../uploads';

/** Who may report anomalies and work on them; only a safety officer closes or reopens one. */
const REPORTERS = ['conductor', 'safety', 'admin', 'operator'] as const;
const CLOSERS = ['safety'] as const;
const HAZARD_WRITERS = ['safety', 'admin'] as const;
const PROCEDURE_WRITERS = ['conductor', 'safety', 'admin'] as const;

const tx = <T>(fn: (t: Transaction) => Promise<T>) => Anomaly.sequelize!.transaction(fn);
const actorOf = (user: Express.User | undefined): Actor => ({ id: user!.id, name: user!.name });
const quote = (s: string) => `“${s}”`;

function refuseWhenClosed(a: Anomaly) {
  if (a.status === 'closed') throw conflict(`${anomalyRef(a.number)} is closed. A safety officer must reopen it before it can be changed.`, 'anomaly_closed');
}

/** A 404 for something named in the body is the caller's mistake at that field (400); anything else goes on. */
function asBadRequest(message: string, code: string, path: string, fieldMessage: string) {
  return (error: unknown): never => {
    if (error instanceof HttpError && error.status === 404) throw badRequest(message, code, [{ path, message: fieldMessage }]);
    throw error;
  };
}

async function activeMember(teamId: number, id: number, path: string, t: Transaction): Promise<User> {
  const u = await User.findOne({ where: { id, teamId }, transaction: t });
  if (!u || !u.active) {
    const message = u ? `${u.name}'s account is deactivated: choose an active member of the team.` : 'Choose a member of your team.';
    throw badRequest(message, 'unknown_owner', [{ path, message }]);
  }
  return u;
}

export interface AnomalyRouteDeps extends NotifyDeps {
  uploads: UploadStore;
  counts: CountService;
}

export function anomalyRoutes(deps: AnomalyRouteDeps) {
  const { uploads, counts } = deps;

  async function assigned(teamId: number, anomalyId: number, actionId: number, by: string) {
    const [a, c] = await Promise.all([
      Anomaly.findOne({ where: { id: anomalyId, teamId } }),
      CorrectiveAction.findByPk(actionId, { include: [{ model: User, as: 'owner', attributes: ['id', 'name', 'email'] }] }),
    ]);
    if (!a || !c?.owner) return;
    await notifyCorrectiveActionAssigned(deps, {
      owner: { id: c.owner.id, name: c.owner.name, email: c.owner.email },
      assignedBy: by,
      anomaly: { id: a.id, ref: anomalyRef(a.number), title: a.title },
      action: { description: c.description, dueDate: c.dueDate },
    });
  }

  return [
    route({
      method: 'get',
      path: '/anomalies',
      access: 'signed-in',
      query: anomalyListQuerySchema,
      handler: async ({ query, user }) => {
        const teamId = user!.teamId;
        const rows = await listAnomalies(teamId, {
          ...(query.countId ? { countId: query.countId } : {}),
          ...(query.status ? { status: query.status } : {}),
        });
        const matrix = matrixCache(teamId);
        const out = [];
        for (const a of rows) {
          if (query.hazardId && !(a.hazards ?? []).some((h) => h.id === query.hazardId)) continue;
          if (query.procedureId && !(a.revisionLinks ?? []).some((l) => l.revision?.procedureId === query.procedureId)) continue;
          out.push(summaryDto(a, await matrix(a.matrixId)));
        }
        return out;
      },
    }),
    route({
      method: 'get',
      path: '/anomalies/people',
      access: 'signed-in',
      handler: async ({ user }): Promise<AnomalyPersonDto[]> => {
        const people = await User.findAll({ where: { teamId: user!.teamId, active: true }, attributes: ['id', 'name'], order: [['name', 'ASC']] });
        return people.map((p) => ({ id: p.id, name: p.name }));
      },
    }),
    route({
      method: 'get',
      path: '/anomalies/:id',
      access: 'signed-in',
      params: anomalyParamSchema,
      handler: ({ params, user }) => anomalyDtoFor(user!.teamId, params.id),
    }),
    route({
      method: 'post',
      path: '/anomalies',
      access: REPORTERS,
      status: 201,
      body: anomalyCreateInputSchema,
      handler: async ({ body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        const now = Date.now();
        let instant: { tSeconds: number | null; countStatus: string | null } = { tSeconds: null, countStatus: null };
        let countName: string | null = null;
        if (body.countId != null) {
          const count = await Count.findOne({ where: { id: body.countId, teamId } });
          if (!count) throw badRequest('There is no such count in your team.', 'unknown_count', [{ path: 'countId', message: 'No such count.' }]);
          countName = count.name;
          const events = await counts.eventsSince(teamId, count.id, 0);
          instant = instantOf(events as unknown as CountEvent[], body.at!, now);
        } else if (body.at !== undefined && body.at > now + 60_000) {
          throw badRequest('This instant is in the future.', 'instant_in_future', [{ path: 'at', message: 'This instant is in the future.' }]);
        }
        return tx(async (t) => {
          const matrixId = await defaultMatrixId(teamId, t);
          const m = await resolveMatrix(teamId, matrixId, t);
          checkSeverity(m, body.severity);
          const last = (await Anomaly.max('number', { where: { teamId }, transaction: t })) as number | null;
          const a = await Anomaly.create(
            {
              teamId,
              number: (last ?? 0) + 1,
              title: body.title,
              description: body.description,
              immediateActions: body.immediateActions,
              matrixId,
              severity: body.severity,
              countId: body.countId ?? null,
              at: body.at ?? now,
              tSeconds: instant.tSeconds,
              countStatus: instant.countStatus,
              reportedById: actor.id,
              closedAt: null,
              closedById: null,
            },
            { transaction: t },
          );
          const where = countName
            ? ` in the count ${quote(countName)} at ${tText(instant.tSeconds) ?? 'an instant before it started'}${instant.countStatus ? ` (${instant.countStatus})` : ''}`
            : ' outside a count';
          await say(a.id, actor, `Reported ${anomalyRef(a.number)} ${quote(a.title)}${where}, severity ${severityLabel(m, a.severity)}.`, t);
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'patch',
      path: '/anomalies/:id',
      access: REPORTERS,
      params: anomalyParamSchema,
      body: anomalyUpdateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const m = await resolveMatrix(teamId, a.matrixId, t);
          if (body.severity !== undefined) checkSeverity(m, body.severity);
          const words: Record<string, string> = { title: 'title', description: 'description', immediateActions: 'immediate actions', severity: 'severity' };
          const lines: string[] = [];
          for (const key of ['title', 'description', 'immediateActions', 'severity'] as const) {
            const value = body[key];
            if (value === undefined || value === a[key]) continue;
            const shown = (v: string) => (key === 'severity' ? severityLabel(m, v) : v.length > 120 ? `${v.slice(0, 117)}…` : v || '(nothing)');
            lines.push(`Changed the ${words[key]} from ${quote(shown(a[key]))} to ${quote(shown(value))}.`);
            a.set(key, value);
          }
          if (lines.length) {
            await a.save({ transaction: t });
            for (const line of lines) await say(a.id, actor, line, t);
          }
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/anomalies/:id/attachments',
      access: REPORTERS,
      status: 201,
      params: anomalyParamSchema,
      // Access is checked before the body is read; the file waits in memory until every check has passed.
      before: [singleFileUpload('file')],
      body: attachmentFieldsSchema,
      handler: async ({ params, body, req, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        const file = await acceptUpload(req.file, 'file');
        return uploads.transaction(async ({ transaction: t, save }) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const upload = await save(file, { teamId, userId: actor.id });
          await AnomalyAttachment.create({ anomalyId: a.id, uploadId: upload.id, caption: body.caption, createdById: actor.id }, { transaction: t });
          await say(a.id, actor, `Attached ${quote(upload.originalName)}${body.caption ? ` (${body.caption})` : ''}.`, t);
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'delete',
      path: '/anomalies/:id/attachments/:attachmentId',
      access: REPORTERS,
      params: anomalyAttachmentParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const att = (a.attachments ?? []).find((x) => x.id === params.attachmentId);
          if (!att) throw notFound('There is no such attachment on this anomaly.');
          await att.destroy({ transaction: t });
          await uploads.remove(att.upload!, t);
          await say(a.id, actor, `Removed the attachment ${quote(att.upload!.originalName)}.`, t);
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/anomalies/:id/hazards',
      access: REPORTERS,
      status: 201,
      params: anomalyParamSchema,
      body: hazardLinkInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const h = await findHazard(teamId, body.hazardId, t).catch(
            asBadRequest('There is no such hazard in your register.', 'unknown_hazard', 'hazardId', 'No such hazard.'),
          );
          if ((a.hazards ?? []).some((x) => x.id === h.id)) throw conflict(`${hazardCode(h.number)} is already linked to this anomaly.`, 'already_linked');
          await AnomalyHazard.create({ anomalyId: a.id, hazardId: h.id, createdById: actor.id }, { transaction: t });
          await say(a.id, actor, `Linked the hazard ${hazardCode(h.number)} ${quote(h.title)}.`, t);
          await record(h.id, actor, 'anomaly', null, `${anomalyRef(a.number)} ${a.title}`, t);
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'delete',
      path: '/anomalies/:id/hazards/:hazardId',
      access: REPORTERS,
      params: anomalyHazardParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const h = (a.hazards ?? []).find((x) => x.id === params.hazardId);
          if (!h) throw notFound('This hazard is not linked to this anomaly.');
          await AnomalyHazard.destroy({ where: { anomalyId: a.id, hazardId: h.id }, transaction: t });
          await say(a.id, actor, `Unlinked the hazard ${hazardCode(h.number)} ${quote(h.title)}.`, t);
          await record(h.id, actor, 'anomaly', `${anomalyRef(a.number)} ${a.title}`, null, t);
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/anomalies/:id/hazards/new',
      access: HAZARD_WRITERS,
      status: 201,
      params: anomalyParamSchema,
      body: hazardCreateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const h = await createHazard(teamId, actor, body, t);
          await AnomalyHazard.create({ anomalyId: a.id, hazardId: h.id, createdById: actor.id }, { transaction: t });
          await say(a.id, actor, `Added the hazard ${hazardCode(h.number)} ${quote(h.title)} to the register from this anomaly, and linked it.`, t);
          await record(h.id, actor, 'anomaly', null, `${anomalyRef(a.number)} ${a.title}`, t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/anomalies/:id/actions',
      access: REPORTERS,
      status: 201,
      params: anomalyParamSchema,
      body: correctiveActionInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        const { dto, actionId } = await tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const owner = await activeMember(teamId, body.ownerId, 'ownerId', t);
          const c = await CorrectiveAction.create({ anomalyId: a.id, ...body }, { transaction: t });
          await say(a.id, actor, `Added the corrective action ${quote(c.description)}, owner ${owner.name}, due ${c.dueDate}, ${ACTION_STATUS_LABELS[c.status as ActionStatus].toLowerCase()}.`, t);
          return { dto: await anomalyDtoFor(teamId, a.id, t), actionId: c.id };
        });
        await assigned(teamId, params.id, actionId, actor.name);
        return dto;
      },
    }),
    route({
      method: 'patch',
      path: '/anomalies/:id/actions/:actionId',
      access: REPORTERS,
      params: anomalyActionParamSchema,
      body: correctiveActionUpdateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        const { dto, reassigned } = await tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          refuseWhenClosed(a);
          const c = (a.actions ?? []).find((x) => x.id === params.actionId);
          if (!c) throw notFound('There is no such corrective action on this anomaly.');
          const lines: string[] = [];
          let reassigned = false;
          if (body.ownerId !== undefined && body.ownerId !== c.ownerId) {
            const owner = await activeMember(teamId, body.ownerId, 'ownerId', t);
            lines.push(`Gave the corrective action ${quote(c.description)} to ${owner.name} (was ${c.owner?.name ?? 'nobody'}).`);
            c.ownerId = owner.id;
            reassigned = true;
          }
          if (body.description !== undefined && body.description !== c.description) {
            lines.push(`Reworded a corrective action from ${quote(c.description)} to ${quote(body.description)}.`);
            c.description = body.description;
          }
          if (body.dueDate !== undefined && body.dueDate !== c.dueDate) {
            lines.push(`Moved the due date of ${quote(c.description)} from ${c.dueDate} to ${body.dueDate}.`);
            c.dueDate = body.dueDate;
          }
          if (body.status !== undefined && body.status !== c.status) {
            lines.push(`Marked the corrective action ${quote(c.description)} ${ACTION_STATUS_LABELS[body.status].toLowerCase()} (was ${ACTION_STATUS_LABELS[c.status as ActionStatus].toLowerCase()}).`);
            c.status = body.status;
          }
          if (lines.length) {
            await c.save({ transaction: t });
            for (const line of lines) await say(a.id, actor, line, t);
          }
          return { dto: await anomalyDtoFor(teamId, a.id, t), reassigned };
        });
        if (reassigned) await assigned(teamId, params.id, params.actionId, actor.name);
        return dto;
      },
    }),
    route({
      method: 'post',
      path: '/anomalies/:id/close',
      access: CLOSERS,
      params: anomalyParamSchema,
      body: closeInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          if (a.status === 'closed') throw conflict(`${anomalyRef(a.number)} is already closed.`, 'already_closed');
          const open = (a.actions ?? []).filter((c) => c.status !== 'done');
          if (open.length) {
            const list = open.map((c) => `${quote(c.description)} (${ACTION_STATUS_LABELS[c.status as ActionStatus].toLowerCase()})`).join(', ');
            throw conflict(
              `${anomalyRef(a.number)} cannot be closed while ${open.length === 1 ? 'a corrective action is' : `${open.length} corrective actions are`} not done: ${list}.`,
              'actions_not_done',
            );
          }
          a.status = 'closed';
          a.closedAt = new Date();
          a.closedById = actor.id;
          await a.save({ transaction: t });
          await say(a.id, actor, `Closed ${anomalyRef(a.number)}${body.note ? `: ${body.note}` : '.'}`, t);
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/anomalies/:id/reopen',
      access: CLOSERS,
      params: anomalyParamSchema,
      body: closeInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          if (a.status !== 'closed') throw conflict(`${anomalyRef(a.number)} is open already.`, 'not_closed');
          a.status = 'open';
          a.closedAt = null;
          a.closedById = null;
          await a.save({ transaction: t });
          await say(a.id, actor, `Reopened ${anomalyRef(a.number)}${body.note ? `: ${body.note}` : '.'}`, t);
          return anomalyDtoFor(teamId, a.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/anomalies/:id/lessons',
      access: PROCEDURE_WRITERS,
      params: anomalyParamSchema,
      body: lessonInputSchema,
      handler: async ({ params, body, user }): Promise<LessonDto> => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const a = await findAnomaly(teamId, params.id, t);
          const p = await findProcedure(teamId, body.procedureId, t).catch(
            asBadRequest('There is no such procedure in your team.', 'unknown_procedure', 'procedureId', 'No such procedure.'),
          );
          // One draft at a time per procedure: an open one is linked rather than a second made.
          const open = revisionsOf(p).find((r) => r.status === 'draft');
          const draft = open ?? (await openDraft(p, actor.id, t));
          const created = !open;
          const linked = (a.revisionLinks ?? []).some((l) => l.revisionId === draft.id);
          if (!linked) {
            await AnomalyRevision.create({ anomalyId: a.id, revisionId: draft.id, drafted: created, createdById: actor.id }, { transaction: t });
            await say(
              a.id,
              actor,
              created
                ? `Opened revision ${draft.number} of ${quote(p.name)} as a draft because of this anomaly.`
                : `Linked the open draft, revision ${draft.number} of ${quote(p.name)}, to this anomaly.`,
              t,
            );
          }
          return { anomaly: await anomalyDtoFor(teamId, a.id, t), procedureId: p.id, revisionNumber: draft.number, created };
        });
      },
    }),
  ];
}
