import type { Transaction } from 'sequelize';
import {
  acceptanceInputSchema,
  evidenceInputSchema,
  evidenceParamSchema,
  fileEvidenceInputSchema,
  hazardCreateInputSchema,
  hazardListQuerySchema,
  hazardUpdateInputSchema,
  idParamSchema,
  mitigationInputSchema,
  mitigationParamSchema,
  mitigationUpdateInputSchema,
  statusChangeInputSchema,
  type HistoryEntryDto,
} from '../../src/contract/hazards';
import { acceptanceProgress } from '../../src/domain/hazards/acceptance';
import { canTransition, nextStatuses, type HazardStatus, type MitigationKind } from '../../src/domain/hazards/mitigation';
import { HttpError, badRequest, conflict, notFound } from '../http/errors';
import { route } from '../http/route';
import { roleHolders, type Notifier } from '../mail/notify';
import { runCalc } from '../hazards/calc';
import {
  checkRiskFields,
  createHazard,
  evidenceFacts,
  findHazard,
  hazardDto,
  hazardDtoFor,
  HAZARD_INCLUDE,
  mitigationDto,
  record,
  refuseRetired,
  residualLevel,
  riskFieldsOf,
  type Actor,
  type RiskFields,
} from '../hazards/hazards';
import { resolveMatrix, severityOut } from '../hazards/matrices';
import { Hazard, HazardAcceptance, HazardHistory, Mitigation, MitigationEvidence, type Upload } from '../models';
import { acceptUpload, singleFileUpload, type UploadStore } from '../uploads';

const WRITERS = ['safety', 'admin'] as const;
const RISK_KEYS = ['matrixId', 'initialSeverity', 'initialLikelihood', 'residualSeverity', 'residualLikelihood'] as const;
const LOCKED: readonly HazardStatus[] = ['accepted', 'closed'];

const tx = <T>(fn: (t: Transaction) => Promise<T>) => Hazard.sequelize!.transaction(fn);
const actorOf = (user: Express.User | undefined): Actor => ({ id: user!.id, name: user!.name });

/** Signatures are for one residual risk: any change to it, or a step back, voids them. */
async function clearAcceptances(h: Hazard, actor: Actor, t: Transaction, why: string) {
  const existing = h.acceptances ?? [];
  if (existing.length === 0) return;
  await HazardAcceptance.destroy({ where: { hazardId: h.id }, transaction: t });
  await record(
    h.id,
    actor,
    'acceptances',
    existing.map((a) => ({ userName: a.userName, role: a.role })),
    { cleared: why },
    t,
  );
}

async function setStatus(h: Hazard, to: HazardStatus, actor: Actor, t: Transaction, note?: string) {
  const from = h.status;
  h.status = to;
  await h.save({ transaction: t });
  await record(h.id, actor, 'status', from, note ? { status: to, note } : to, t);
}

function kindsOf(h: Hazard): MitigationKind[] {
  return (h.mitigations ?? []).map((m) => m.kind);
}

/** Would the residual still stand with these mitigation kinds? (400 if not, before anything is saved.) */
async function recheckResidual(teamId: number, h: Hazard, kinds: MitigationKind[], t: Transaction) {
  if (h.residualLikelihood === null) return;
  await checkRiskFields(teamId, riskFieldsOf(h), kinds, t);
}

function refuseWhenClosed(h: Hazard) {
  if (h.status === 'closed') throw conflict('This hazard is closed. Reopen it before changing it.', 'hazard_closed');
}

function mitigationOf(h: Hazard, mid: number): Mitigation {
  const mit = (h.mitigations ?? []).find((m) => m.id === mid);
  if (!mit) throw notFound('No such mitigation on this hazard.');
  return mit;
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

function historyDto(e: HazardHistory): HistoryEntryDto {
  return { id: e.id, userId: e.userId, userName: e.userName, field: e.field, before: e.before, after: e.after, at: e.createdAt.toISOString() };
}

export function hazardRoutes({ uploads, notifier }: { uploads: UploadStore; notifier: Notifier }) {
  return [
    route({
      method: 'get',
      path: '/hazards',
      access: 'signed-in',
      query: hazardListQuerySchema,
      handler: async ({ query, user }) => {
        const teamId = user!.teamId;
        const rows = await Hazard.findAll({ where: { teamId }, include: HAZARD_INCLUDE, order: [['number', 'ASC']] });
        const matrices = new Map<string, Awaited<ReturnType<typeof resolveMatrix>>>();
        const dtos = [];
        for (const h of rows) {
          if (!matrices.has(h.matrixId)) matrices.set(h.matrixId, await resolveMatrix(teamId, h.matrixId));
          dtos.push(hazardDto(h, matrices.get(h.matrixId)!));
        }
        const q = query.q?.toLowerCase();
        return dtos.filter(
          (d) =>
            (!query.status || d.status === query.status) &&
            (!query.system || d.system === query.system) &&
            (!query.phase || d.phase === query.phase) &&
            (!query.propellant || d.propellants.includes(query.propellant)) &&
            (!query.risk || (d.residualRisk ?? d.initialRisk) === query.risk) &&
            (!q || [d.code, d.title, d.description, ...d.causes, ...d.effects].some((s) => s.toLowerCase().includes(q))),
        );
      },
    }),
    route({
      method: 'get',
      path: '/hazards/:id',
      access: 'signed-in',
      params: idParamSchema,
      handler: ({ params, user }) => hazardDtoFor(user!.teamId, params.id),
    }),
    route({
      method: 'post',
      path: '/hazards',
      access: WRITERS,
      status: 201,
      body: hazardCreateInputSchema,
      handler: async ({ body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const h = await createHazard(teamId, actor, body, t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'patch',
      path: '/hazards/:id',
      access: WRITERS,
      params: idParamSchema,
      body: hazardUpdateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          refuseWhenClosed(h);
          const riskBefore = riskFieldsOf(h);
          const risk: RiskFields = { ...riskBefore };
          for (const key of RISK_KEYS) if (body[key] !== undefined) risk[key] = body[key] as never;
          const riskChanged = !same(risk, riskBefore);
          if (riskChanged && LOCKED.includes(h.status)) {
            throw conflict(`This hazard's risk is ${h.status}. Reopen it before changing the assessment.`, 'hazard_locked');
          }
          if (riskChanged) {
            const m = await checkRiskFields(teamId, risk, kindsOf(h), t);
            // Hazards already on a retired matrix keep it; none may move onto one.
            if (risk.matrixId !== riskBefore.matrixId) refuseRetired(m);
          }

          const shown = (key: string, value: unknown) =>
            (key === 'initialSeverity' || key === 'residualSeverity') && typeof value === 'string' ? severityOut(risk.matrixId, value) : value;
          const changes: { field: string; before: unknown; after: unknown }[] = [];
          for (const [key, value] of Object.entries(body)) {
            if (value === undefined) continue;
            const before = h.get(key as keyof Hazard);
            if (same(before, value)) continue;
            changes.push({ field: key, before: shown(key, before), after: shown(key, value) });
            h.set(key as never, value as never);
          }
          if (changes.length === 0) return hazardDto(h, await resolveMatrix(teamId, h.matrixId, t));
          await h.save({ transaction: t });
          for (const c of changes) await record(h.id, actor, c.field, c.before, c.after, t);
          if (riskChanged) await clearAcceptances(h, actor, t, 'risk assessment changed');
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/hazards/:id/status',
      access: WRITERS,
      params: idParamSchema,
      body: statusChangeInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        const dto = await tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          const from = h.status;
          if (!canTransition(from, body.to)) {
            const allowed = nextStatuses(from);
            throw conflict(
              `A hazard cannot go from ${from} to ${body.to}. From ${from} it can go to: ${allowed.join(', ') || 'nothing'}.`,
              'invalid_transition',
            );
          }
          const m = await resolveMatrix(teamId, h.matrixId, t);
          if (body.to === 'awaiting-acceptance') {
            if (h.residualLikelihood === null || h.residualSeverity === null) {
              throw badRequest('Assess the residual risk (residual severity and likelihood) before asking for acceptance.', 'residual_required', [
                { path: 'residualLikelihood', message: 'Residual risk not assessed.' },
              ]);
            }
            await checkRiskFields(teamId, riskFieldsOf(h), kindsOf(h), t);
          }
          if (body.to === 'accepted') {
            const level = residualLevel(h, m)!;
            const p = acceptanceProgress(
              m.acceptanceMap,
              level,
              (h.acceptances ?? []).map((a) => ({ userId: String(a.userId), role: a.role })),
            );
            if (!p.complete) {
              throw conflict(`Acceptance still needs a signature from: ${p.missingRoles.join(', ')}.`, 'acceptance_incomplete');
            }
          }
          if (body.to === 'mitigating' || body.to === 'open') await clearAcceptances(h, actor, t, `status returned to ${body.to}`);
          await setStatus(h, body.to, actor, t, body.note);
          return hazardDtoFor(teamId, h.id, t);
        });
        if (body.to === 'awaiting-acceptance') {
          // Those who can accept it hear of it (after the commit: a notice never holds up the change).
          const required = dto.acceptanceProgress?.requiredRoles ?? [];
          const ids = await roleHolders(teamId, required, actor.id);
          notifier.notify('acceptance-needed', ids, () => ({
            subject: `Acceptance needed: ${dto.code} ${dto.title}`,
            text: [
              `${actor.name} asks for the residual risk of ${dto.code} "${dto.title}" to be accepted.`,
              `Residual risk: ${dto.residualRisk ?? 'see the hazard'}. Accepted by: ${required.join(' and ') || 'see the hazard'}.`,
              body.note ? `Note: ${body.note}` : null,
              `Read it and sign: ${notifier.appUrl}/hazards/${dto.id}`,
            ]
              .filter((l) => l !== null)
              .join('\n'),
          }));
        }
        return dto;
      },
    }),
    route({
      method: 'post',
      path: '/hazards/:id/acceptances',
      // Any signed-in person reaches the handler, which then requires the role they sign as.
      access: 'signed-in',
      status: 201,
      params: idParamSchema,
      body: acceptanceInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        if (!user!.roles.includes(body.as)) {
          throw new HttpError(403, 'forbidden', `You do not hold the ${body.as} role, so you cannot sign as ${body.as}.`);
        }
        return tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          if (h.status !== 'awaiting-acceptance') {
            throw conflict(`Only a hazard awaiting acceptance can be signed; this one is ${h.status}.`, 'not_awaiting_acceptance');
          }
          const m = await resolveMatrix(teamId, h.matrixId, t);
          const level = residualLevel(h, m)!;
          const required = m.acceptanceMap[level] ?? [];
          if (!required.includes(body.as)) {
            throw badRequest(
              `A ${level} residual risk is accepted by: ${required.join(' and ')}. The ${body.as} role does not sign for it.`,
              'role_not_required',
              [{ path: 'as', message: `Not a required role for ${level} risk.` }],
            );
          }
          const existing = h.acceptances ?? [];
          const mine = existing.find((a) => a.userId === actor.id);
          if (mine && mine.role === body.as) throw conflict(`You have already signed as ${body.as}.`, 'already_signed');
          if (mine) {
            throw badRequest(
              `You already signed as ${mine.role}. One person can fill only one required role: another ${body.as} must sign.`,
              'same_person',
              [{ path: 'as', message: 'The same person cannot sign for two roles.' }],
            );
          }
          const taken = existing.find((a) => a.role === body.as);
          if (taken) throw conflict(`${taken.userName} has already signed as ${body.as}.`, 'role_already_signed');

          const sig = await HazardAcceptance.create(
            { hazardId: h.id, userId: actor.id, userName: actor.name, role: body.as, riskLevel: level },
            { transaction: t },
          );
          await record(h.id, actor, 'acceptance', null, { role: body.as, riskLevel: level }, t);
          const p = acceptanceProgress(
            m.acceptanceMap,
            level,
            [...existing, sig].map((a) => ({ userId: String(a.userId), role: a.role })),
          );
          if (p.complete) await setStatus(h, 'accepted', actor, t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'get',
      path: '/hazards/:id/history',
      access: 'signed-in',
      params: idParamSchema,
      handler: async ({ params, user }) => {
        const h = await Hazard.findOne({ where: { id: params.id, teamId: user!.teamId } });
        if (!h) throw notFound('No such hazard.');
        const rows = await HazardHistory.findAll({ where: { hazardId: h.id }, order: [['id', 'ASC']] });
        return rows.map(historyDto);
      },
    }),
    route({
      method: 'post',
      path: '/hazards/:id/mitigations',
      access: WRITERS,
      status: 201,
      params: idParamSchema,
      body: mitigationInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          refuseWhenClosed(h);
          const mit = await Mitigation.create({ ...body, hazardId: h.id }, { transaction: t });
          await record(h.id, actor, `mitigation:${mit.id}`, null, mitigationDto(mit), t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'patch',
      path: '/hazards/:id/mitigations/:mid',
      access: WRITERS,
      params: mitigationParamSchema,
      body: mitigationUpdateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          refuseWhenClosed(h);
          const mit = mitigationOf(h, params.mid);
          if (body.kind && body.kind !== mit.kind) {
            await recheckResidual(teamId, h, (h.mitigations ?? []).map((m) => (m.id === mit.id ? body.kind! : m.kind)), t);
          }
          const changes: { field: string; before: unknown; after: unknown }[] = [];
          for (const [key, value] of Object.entries(body)) {
            if (value === undefined) continue;
            const before = mit.get(key as keyof Mitigation);
            if (same(before, value)) continue;
            changes.push({ field: key, before, after: value });
            mit.set(key as never, value as never);
          }
          if (changes.length) {
            await mit.save({ transaction: t });
            for (const c of changes) await record(h.id, actor, `mitigation:${mit.id}.${c.field}`, c.before, c.after, t);
          }
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'delete',
      path: '/hazards/:id/mitigations/:mid',
      access: WRITERS,
      params: mitigationParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          refuseWhenClosed(h);
          const mit = mitigationOf(h, params.mid);
          await recheckResidual(teamId, h, (h.mitigations ?? []).filter((m) => m.id !== mit.id).map((m) => m.kind), t);
          const before = mitigationDto(mit);
          const files = (mit.evidence ?? []).map((e) => e.upload).filter((u): u is Upload => !!u);
          // The evidence rows go with the mitigation (ON DELETE CASCADE); their files then go too.
          await mit.destroy({ transaction: t });
          for (const u of files) await uploads.remove(u, t);
          await record(h.id, actor, `mitigation:${mit.id}`, before, null, t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/hazards/:id/evidence',
      access: WRITERS,
      status: 201,
      params: idParamSchema,
      body: evidenceInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        const outputs = await runCalc(teamId, body.calc, body.inputs);
        return tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          refuseWhenClosed(h);
          const mit = mitigationOf(h, body.mitigationId);
          const computedAt = new Date().toISOString();
          const ev = await MitigationEvidence.create(
            {
              mitigationId: mit.id,
              kind: 'calc',
              label: body.label || `${body.calc} calculation`,
              data: { calc: body.calc, inputs: body.inputs, outputs, computedAt },
              createdById: actor.id,
            },
            { transaction: t },
          );
          await record(h.id, actor, `mitigation:${mit.id}.evidence`, null, { id: ev.id, kind: 'calc', calc: body.calc, label: ev.label }, t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/hazards/:id/mitigations/:mid/evidence/files',
      access: WRITERS,
      status: 201,
      params: mitigationParamSchema,
      // Access is checked before the body is read; the file waits in memory until every check has passed.
      before: [singleFileUpload('file')],
      body: fileEvidenceInputSchema,
      handler: async ({ params, body, req, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        const file = await acceptUpload(req.file, 'file');
        return uploads.transaction(async ({ transaction: t, save }) => {
          const h = await findHazard(teamId, params.id, t);
          refuseWhenClosed(h);
          const mit = mitigationOf(h, params.mid);
          const upload = await save(file, { teamId, userId: actor.id });
          const ev = await MitigationEvidence.create(
            { mitigationId: mit.id, kind: 'file', label: body.label || upload.originalName, data: {}, uploadId: upload.id, createdById: actor.id },
            { transaction: t },
          );
          ev.upload = upload;
          await record(h.id, actor, `mitigation:${mit.id}.evidence`, null, evidenceFacts(ev), t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
    route({
      method: 'delete',
      path: '/hazards/:id/evidence/:evidenceId',
      access: WRITERS,
      params: evidenceParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        const actor = actorOf(user);
        return tx(async (t) => {
          const h = await findHazard(teamId, params.id, t);
          refuseWhenClosed(h);
          const mit = (h.mitigations ?? []).find((m) => (m.evidence ?? []).some((e) => e.id === params.evidenceId));
          const ev = mit?.evidence?.find((e) => e.id === params.evidenceId);
          if (!mit || !ev) throw notFound('No such evidence on this hazard.');
          const before = evidenceFacts(ev);
          await ev.destroy({ transaction: t });
          if (ev.upload) await uploads.remove(ev.upload, t);
          await record(h.id, actor, `mitigation:${mit.id}.evidence`, before, null, t);
          return hazardDtoFor(teamId, h.id, t);
        });
      },
    }),
  ];
}
