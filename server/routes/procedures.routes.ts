import type { Transaction } from 'sequelize';
import { z } from 'zod';
import {
  attachmentInputSchema,
  attachmentParamSchema,
  diffQuerySchema,
  procedureCreateInputSchema,
  procedureParamSchema,
  procedureUpdateInputSchema,
  readProcedureDocument,
  revisionContentInputSchema,
  revisionContentSchema,
  revisionParamSchema,
  signoffInputSchema,
  toProcedureDocument,
  type DiffDto,
  type ProcedureDto,
  type RevisionSaveDto,
} from '../../src/contract/procedures';
import { diffRevisions } from '../../src/domain/procedures/diff';
import { checkSignoff, SIGNOFF_ROLES } from '../../src/domain/procedures/release';
import { stepCount, validatePhases } from '../../src/domain/procedures/steps';
import { HttpError, badRequest, conflict, notFound, zodDetails } from '../http/errors';
import { route } from '../http/route';
import { roleHolders, type Notifier } from '../mail/notify';
import { Procedure, ProcedureAttachment, ProcedureRevision, ProcedureSignoff, type Upload } from '../models';
import {
  cautionContext,
  checkListedStations,
  currentCautions,
  findProcedure,
  findRevision,
  keyed,
  openDraft,
  procedureDto,
  procedureSummary,
  referencesOf,
  removeUnusedUploads,
  revisionDto,
  revisionsOf,
  stepKeysOf,
  tx,
} from '../procedures/procedures';
import { acceptUpload, singleFileUpload, type UploadStore } from '../uploads';

/** Conductors write procedures; safety officers and admins too. Everyone signed in reads them. */
const WRITERS = ['conductor', 'safety', 'admin'] as const;
const ROLE_NAMES = { conductor: 'test conductor', safety: 'safety officer' } as const;

function frozen(number: number): HttpError {
  return conflict(`Revision ${number} is released and frozen. Open a new revision to change it.`, 'revision_released');
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/** The diagrams are part of what is signed: changing them on a signed draft withdraws its sign-offs. */
async function clearSignoffs(revisionId: number, signed: number, transaction: Transaction): Promise<boolean> {
  if (signed === 0) return false;
  await ProcedureSignoff.destroy({ where: { revisionId }, transaction });
  return true;
}

const slug = (s: string) =>
  s
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60) || 'procedure';

export function procedureRoutes({ uploads, notifier }: { uploads: UploadStore; notifier: Notifier }) {
  return [
    route({
      method: 'get',
      path: '/procedures',
      access: 'signed-in',
      handler: async ({ user }) => {
        const rows = await Procedure.findAll({
          where: { teamId: user!.teamId },
          include: [{ model: ProcedureRevision, as: 'revisions', attributes: ['id', 'number', 'status', 'releasedAt'] }],
          order: [['name', 'ASC'], ['id', 'ASC']],
        });
        return rows.map(procedureSummary);
      },
    }),
    route({
      method: 'post',
      path: '/procedures',
      access: WRITERS,
      status: 201,
      body: procedureCreateInputSchema,
      handler: async ({ body, user }): Promise<ProcedureDto> => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const refs = await referencesOf(teamId, t);
          checkListedStations(body.stations, refs.stations);
          const p = await Procedure.create({ teamId, ...body, createdById: user!.id }, { transaction: t });
          await ProcedureRevision.create(
            { procedureId: p.id, number: 1, status: 'draft', basedOn: null, phases: [], releasedCautions: null, releasedAt: null, createdById: user!.id, updatedById: user!.id },
            { transaction: t },
          );
          return procedureDto(await findProcedure(teamId, p.id, t));
        });
      },
    }),
    route({
      method: 'post',
      path: '/procedures/import',
      access: WRITERS,
      status: 201,
      // The file is checked as a whole below, so every problem can be listed at once.
      body: z.record(z.string(), z.unknown(), { error: 'Send the procedure file as a JSON object.' }),
      handler: async ({ body, user }): Promise<ProcedureDto> => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const refs = await referencesOf(teamId, t);
          const read = readProcedureDocument(body, refs);
          if (!read.ok) {
            const n = read.problems.length;
            throw badRequest(`The file has ${n} problem${n === 1 ? '' : 's'}; nothing was imported.`, 'import_invalid', read.problems);
          }
          const { procedure, phases } = read.value;
          const p = await Procedure.create({ teamId, ...procedure, createdById: user!.id }, { transaction: t });
          await ProcedureRevision.create(
            { procedureId: p.id, number: 1, status: 'draft', basedOn: null, phases: keyed(phases), releasedCautions: null, releasedAt: null, createdById: user!.id, updatedById: user!.id },
            { transaction: t },
          );
          return procedureDto(await findProcedure(teamId, p.id, t));
        });
      },
    }),
    route({
      method: 'get',
      path: '/procedures/:id',
      access: 'signed-in',
      params: procedureParamSchema,
      handler: async ({ params, user }) => procedureDto(await findProcedure(user!.teamId, params.id)),
    }),
    route({
      method: 'patch',
      path: '/procedures/:id',
      access: WRITERS,
      params: procedureParamSchema,
      body: procedureUpdateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const p = await findProcedure(teamId, params.id, t);
          if (body.stations) checkListedStations(body.stations, (await referencesOf(teamId, t)).stations);
          p.set(body);
          await p.save({ transaction: t });
          return procedureDto(await findProcedure(teamId, p.id, t));
        });
      },
    }),
    route({
      method: 'post',
      path: '/procedures/:id/revisions',
      access: WRITERS,
      status: 201,
      params: procedureParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const p = await findProcedure(teamId, params.id, t);
          const open = revisionsOf(p).find((r) => r.status === 'draft');
          if (open) throw conflict(`Revision ${open.number} is still a draft. Finish and release it, or discard it, before opening another.`, 'draft_open');
          const draft = await openDraft(p, user!.id, t);
          const fresh = await findProcedure(teamId, p.id, t);
          return revisionDto(fresh, findRevision(fresh, draft.number), await cautionContext(teamId, t));
        });
      },
    }),
    route({
      method: 'get',
      path: '/procedures/:id/revisions/:rev',
      access: 'signed-in',
      params: revisionParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        const p = await findProcedure(teamId, params.id);
        return revisionDto(p, findRevision(p, params.rev), await cautionContext(teamId));
      },
    }),
    route({
      method: 'put',
      path: '/procedures/:id/revisions/:rev',
      access: WRITERS,
      params: revisionParamSchema,
      body: revisionContentInputSchema,
      handler: async ({ req, params, user }): Promise<RevisionSaveDto> => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const p = await findProcedure(teamId, params.id, t);
          const rev = findRevision(p, params.rev);
          if (rev.status !== 'draft') throw frozen(rev.number);
          const refs = await referencesOf(teamId, t);
          const checked = revisionContentSchema(refs).safeParse(req.body);
          if (!checked.success) throw badRequest('Some steps refer to stations or hazards your team does not have.', 'validation_failed', zodDetails(checked.error));
          const phases = keyed(checked.data.phases);
          const changed = !same(phases, rev.phases);
          const signed = rev.signoffs ?? [];
          const signoffsCleared = changed && signed.length > 0;
          if (signoffsCleared) await ProcedureSignoff.destroy({ where: { revisionId: rev.id }, transaction: t });
          if (changed) {
            rev.phases = phases;
            rev.updatedById = user!.id;
            await rev.save({ transaction: t });
          }
          const fresh = await findProcedure(teamId, p.id, t);
          return { ...revisionDto(fresh, findRevision(fresh, rev.number), await cautionContext(teamId, t)), signoffsCleared };
        });
      },
    }),
    route({
      method: 'delete',
      path: '/procedures/:id/revisions/:rev',
      access: WRITERS,
      params: revisionParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const p = await findProcedure(teamId, params.id, t);
          const rev = findRevision(p, params.rev);
          if (rev.status !== 'draft') throw frozen(rev.number);
          if (revisionsOf(p).length === 1) throw conflict('This is the procedure\u2019s only revision; edit it instead of discarding it.', 'only_revision');
          const files = (rev.attachments ?? []).map((a) => a.upload!);
          await ProcedureAttachment.destroy({ where: { revisionId: rev.id }, transaction: t });
          await rev.destroy({ transaction: t });
          await removeUnusedUploads(uploads, files, t);
          return procedureDto(await findProcedure(teamId, p.id, t));
        });
      },
    }),
    route({
      method: 'post',
      path: '/procedures/:id/revisions/:rev/attachments',
      access: WRITERS,
      status: 201,
      params: revisionParamSchema,
      // Access is checked before the body is read; the file waits in memory until every check has passed.
      before: [singleFileUpload('file')],
      body: attachmentInputSchema,
      handler: async ({ req, params, body, user }): Promise<RevisionSaveDto> => {
        const teamId = user!.teamId;
        const file = await acceptUpload(req.file, 'file');
        return uploads.transaction(async ({ transaction: t, save }) => {
          const p = await findProcedure(teamId, params.id, t);
          const rev = findRevision(p, params.rev);
          if (rev.status !== 'draft') throw frozen(rev.number);
          if (body.stepKey !== null && !stepKeysOf(rev.phases).has(body.stepKey)) {
            throw badRequest(`Revision ${rev.number} has no such step. Save your edits first, then attach the file.`, 'validation_failed', [
              { path: 'stepKey', message: 'Not a step of this revision.' },
            ]);
          }
          const upload = await save(file, { teamId, userId: user!.id });
          await ProcedureAttachment.create(
            { revisionId: rev.id, stepKey: body.stepKey, uploadId: upload.id, caption: body.caption, createdById: user!.id },
            { transaction: t },
          );
          const signoffsCleared = await clearSignoffs(rev.id, rev.signoffs?.length ?? 0, t);
          const fresh = await findProcedure(teamId, p.id, t);
          return { ...revisionDto(fresh, findRevision(fresh, rev.number), await cautionContext(teamId, t)), signoffsCleared };
        });
      },
    }),
    route({
      method: 'delete',
      path: '/procedures/:id/revisions/:rev/attachments/:attachmentId',
      access: WRITERS,
      params: attachmentParamSchema,
      handler: async ({ params, user }): Promise<RevisionSaveDto> => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const p = await findProcedure(teamId, params.id, t);
          const rev = findRevision(p, params.rev);
          const attachment = (rev.attachments ?? []).find((a) => a.id === params.attachmentId);
          if (!attachment) throw notFound(`Revision ${rev.number} has no such attachment.`);
          if (rev.status !== 'draft') throw frozen(rev.number);
          const file: Upload = attachment.upload!;
          await attachment.destroy({ transaction: t });
          // Earlier revisions may still show the same file: it goes only with its last link.
          await removeUnusedUploads(uploads, [file], t);
          const signoffsCleared = await clearSignoffs(rev.id, rev.signoffs?.length ?? 0, t);
          const fresh = await findProcedure(teamId, p.id, t);
          return { ...revisionDto(fresh, findRevision(fresh, rev.number), await cautionContext(teamId, t)), signoffsCleared };
        });
      },
    }),
    route({
      method: 'post',
      path: '/procedures/:id/revisions/:rev/signoffs',
      access: ['conductor', 'safety'],
      status: 201,
      params: revisionParamSchema,
      body: signoffInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        if (!user!.roles.includes(body.as)) {
          throw new HttpError(403, 'forbidden', `You do not hold the ${ROLE_NAMES[body.as]} role, so you cannot sign as ${ROLE_NAMES[body.as]}.`);
        }
        const signed = await tx(async (t) => {
          const p = await findProcedure(teamId, params.id, t);
          const rev = findRevision(p, params.rev);
          const existing = rev.signoffs ?? [];
          const check = checkSignoff(rev.status, existing.map((s) => ({ role: s.role, userId: s.userId })), { role: body.as, userId: user!.id });
          if (!check.ok) {
            if (check.code === 'not_draft') throw frozen(rev.number);
            if (check.code === 'same_person') throw badRequest(check.message, 'same_person', [{ path: 'as', message: 'The same person cannot sign for both roles.' }]);
            throw conflict(check.message, check.code);
          }
          if (stepCount(rev.phases) === 0) throw conflict(`Revision ${rev.number} has no steps yet; there is nothing to sign.`, 'revision_empty');
          const refs = await referencesOf(teamId, t);
          const problems = validatePhases(rev.phases, refs);
          if (problems.length) throw conflict(`Revision ${rev.number} has ${problems.length} problem(s) to fix before it can be signed.`, 'revision_invalid');
          await ProcedureSignoff.create({ revisionId: rev.id, userId: user!.id, userName: user!.name, role: body.as }, { transaction: t });
          if (check.releases) {
            rev.status = 'released';
            rev.releasedAt = new Date();
            // The cautions are part of what was signed: keep them as they stand now.
            rev.releasedCautions = currentCautions(rev.phases, await cautionContext(teamId, t));
            await rev.save({ transaction: t });
          }
          const fresh = await findProcedure(teamId, p.id, t);
          return { dto: revisionDto(fresh, findRevision(fresh, rev.number), await cautionContext(teamId, t)), procedureName: p.name, releases: check.releases };
        });
        if (!signed.releases) {
          // One signature given: whoever holds the other role hears that theirs is needed.
          const missing = SIGNOFF_ROLES.filter((r) => r !== body.as);
          const ids = await roleHolders(teamId, missing, user!.id);
          notifier.notify('signoff-needed', ids, () => ({
            subject: `Sign-off needed: ${signed.procedureName}, revision ${params.rev}`,
            text: [
              `${user!.name} signed revision ${params.rev} of "${signed.procedureName}" as ${ROLE_NAMES[body.as]}.`,
              `It is released when someone else signs as ${missing.map((r) => ROLE_NAMES[r]).join(' and ')}.`,
              `Read it and sign: ${notifier.appUrl}/procedures/${params.id}/revisions/${params.rev}`,
            ].join('\n'),
          }));
        }
        return signed.dto;
      },
    }),
    route({
      method: 'get',
      path: '/procedures/:id/diff',
      access: 'signed-in',
      params: procedureParamSchema,
      query: diffQuerySchema,
      handler: async ({ params, query, user }): Promise<DiffDto> => {
        const p = await findProcedure(user!.teamId, params.id);
        const from = findRevision(p, query.from);
        const to = findRevision(p, query.to);
        return { from: from.number, to: to.number, ...diffRevisions(from.phases, to.phases) };
      },
    }),
    route({
      method: 'get',
      path: '/procedures/:id/revisions/:rev/export',
      access: 'signed-in',
      params: revisionParamSchema,
      handler: async ({ res, params, user }) => {
        const teamId = user!.teamId;
        const p = await findProcedure(teamId, params.id);
        const rev = findRevision(p, params.rev);
        const refs = await referencesOf(teamId);
        res.setHeader('Content-Disposition', `attachment; filename="${slug(p.name)}-rev-${rev.number}.holdfire.json"`);
        return toProcedureDocument(rev.phases, {
          procedure: { name: p.name, purpose: p.purpose, testArticle: p.testArticle, site: p.site, stations: p.stations },
          revision: {
            number: rev.number,
            status: rev.status,
            releasedAt: rev.releasedAt ? rev.releasedAt.toISOString() : null,
            signoffs: (rev.signoffs ?? []).map((s) => ({ role: s.role, name: s.userName, at: s.createdAt.toISOString() })),
          },
          stations: refs.stationRows.map((s) => ({ code: s.code, name: s.name, callSign: s.callSign, defaultPpe: s.defaultPpe })),
          hazardCodeById: refs.hazardCodeById,
          exportedAt: new Date().toISOString(),
        });
      },
    }),
  ];
}
