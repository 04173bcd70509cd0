/** Loading, checking and presenting anomalies; the routes stay thin. */
import type { Transaction } from 'sequelize';
import {
  anomalyRef,
  type AnomalyDto,
  type AnomalyRevisionLinkDto,
  type AnomalySummaryDto,
  type CorrectiveActionDto,
} from '../../src/contract/anomalies';
import type { CountEvent } from '../../src/domain/count/events';
import { stateAt } from '../../src/domain/count/reduce';
import { tAt } from '../../src/domain/count/state';
import { formatTMinus } from '../../src/domain/procedures/tminus';
import { badRequest, notFound } from '../http/errors';
import { hazardCode } from '../hazards/hazards';
import { resolveMatrix, severityOut, type ResolvedMatrix } from '../hazards/matrices';
import {
  Anomaly,
  AnomalyAttachment,
  AnomalyHistory,
  AnomalyRevision,
  CorrectiveAction,
  Count,
  Hazard,
  Procedure,
  ProcedureRevision,
  Upload,
  User,
} from '../models';
import { uploadDto } from '../uploads';

export interface Actor {
  id: number;
  name: string;
}

const SUMMARY_INCLUDE = [
  { model: Count, as: 'count', attributes: ['id', 'name'] },
  { model: Hazard, as: 'hazards', attributes: ['id', 'number', 'title', 'status'], through: { attributes: [] } },
  { model: CorrectiveAction, as: 'actions', include: [{ model: User, as: 'owner', attributes: ['id', 'name', 'email'] }] },
  {
    model: AnomalyRevision,
    as: 'revisionLinks',
    include: [{ model: ProcedureRevision, as: 'revision', attributes: ['id', 'number', 'status', 'procedureId'], include: [{ model: Procedure, attributes: ['id', 'name'] }] }],
  },
  { model: User, as: 'reportedBy', attributes: ['id', 'name'] },
];

const DETAIL_INCLUDE = [
  ...SUMMARY_INCLUDE,
  {
    model: AnomalyAttachment,
    as: 'attachments',
    include: [
      { model: Upload, as: 'upload' },
      { model: User, as: 'createdBy', attributes: ['id', 'name'] },
    ],
  },
  { model: AnomalyHistory, as: 'history' },
  { model: User, as: 'closedBy', attributes: ['id', 'name'] },
];

export async function findAnomaly(teamId: number, id: number, transaction?: Transaction): Promise<Anomaly> {
  const a = await Anomaly.findOne({ where: { id, teamId }, include: DETAIL_INCLUDE, transaction });
  if (!a) throw notFound('There is no such anomaly.');
  return a;
}

export async function listAnomalies(teamId: number, where: { countId?: number; status?: string }): Promise<Anomaly[]> {
  return Anomaly.findAll({ where: { teamId, ...where }, include: SUMMARY_INCLUDE, order: [['number', 'DESC']] });
}

/** The severity with its label in the matrix it was rated on ("2 Critical" on the built-in matrix). */
export function severityLabel(m: ResolvedMatrix, key: string): string {
  const s = m.matrix.severities.find((x) => x.key === key);
  return s ? `${s.key} ${s.label}` : key;
}

/** 400 unless `key` is a severity of the matrix. */
export function checkSeverity(m: ResolvedMatrix, key: string): void {
  if (!m.matrix.severities.some((s) => s.key === key)) {
    const allowed = m.matrix.severities.map((s) => `${s.key} (${s.label})`).join(', ');
    const message = `Choose a severity of ${m.matrix.name}: ${allowed}.`;
    throw badRequest(message, 'unknown_severity', [{ path: 'severity', message }]);
  }
}

export interface CountInstant {
  tSeconds: number | null;
  countStatus: string | null;
}

/**
 * T and the count's status at `at`, from its log with the live reducer (the same fold as the replay). An instant
 * before the count was made, or more than a minute ahead of the server's clock, is refused.
 */
export function instantOf(events: readonly CountEvent[], at: number, now: number): CountInstant {
  const first = events[0];
  if (!first || at < first.at) {
    const message = 'This instant is before the count was made. Choose an instant of its log.';
    throw badRequest(message, 'instant_outside_count', [{ path: 'at', message }]);
  }
  if (at > now + 60_000) {
    const message = 'This instant is in the future.';
    throw badRequest(message, 'instant_in_future', [{ path: 'at', message }]);
  }
  const state = stateAt(events, at);
  if (state.startedAt === null) return { tSeconds: null, countStatus: state.status };
  return { tSeconds: tAt(state, at), countStatus: state.status };
}

/** As the count clock shows it: whole seconds by floor, so T-0:01 shows until T reaches zero. */
export function tText(tSeconds: number | null): string | null {
  return tSeconds === null ? null : formatTMinus(Math.floor(tSeconds));
}

export async function say(anomalyId: number, actor: Actor, text: string, transaction: Transaction): Promise<void> {
  await AnomalyHistory.create({ anomalyId, userId: actor.id, userName: actor.name, text }, { transaction });
}

function actionDto(c: CorrectiveAction): CorrectiveActionDto {
  return {
    id: c.id,
    description: c.description,
    ownerId: c.ownerId ?? null,
    ownerName: c.owner?.name ?? null,
    dueDate: c.dueDate,
    status: c.status,
    createdAt: c.createdAt.toISOString(),
  };
}

function revisionLinkDto(l: AnomalyRevision): AnomalyRevisionLinkDto {
  const rev = l.revision!;
  const proc = (rev as ProcedureRevision & { Procedure?: Procedure }).Procedure;
  return {
    procedureId: rev.procedureId as number,
    procedureName: proc?.name ?? '',
    revisionNumber: rev.number,
    revisionStatus: rev.status,
    drafted: l.drafted,
    at: l.createdAt.toISOString(),
  };
}

export function summaryDto(a: Anomaly, m: ResolvedMatrix): AnomalySummaryDto {
  return {
    id: a.id,
    ref: anomalyRef(a.number),
    title: a.title,
    status: a.status,
    matrixId: a.matrixId,
    severity: severityOut(a.matrixId, a.severity),
    severityLabel: severityLabel(m, a.severity),
    countId: a.countId ?? null,
    countName: a.count?.name ?? null,
    at: new Date(a.at).toISOString(),
    atMs: a.at,
    tSeconds: a.tSeconds,
    tText: tText(a.tSeconds),
    countStatus: a.countStatus,
    hazardIds: (a.hazards ?? []).map((h) => h.id).sort((x, y) => x - y),
    openActions: (a.actions ?? []).filter((c) => c.status !== 'done').length,
    revisions: (a.revisionLinks ?? []).map(revisionLinkDto).sort((x, y) => x.at.localeCompare(y.at)),
    reportedBy: a.reportedBy?.name ?? null,
    createdAt: a.createdAt.toISOString(),
  };
}

export function anomalyDto(a: Anomaly, m: ResolvedMatrix): AnomalyDto {
  return {
    ...summaryDto(a, m),
    description: a.description,
    immediateActions: a.immediateActions,
    hazards: [...(a.hazards ?? [])]
      .sort((x, y) => x.number - y.number)
      .map((h) => ({ id: h.id, code: hazardCode(h.number), title: h.title, status: h.status })),
    attachments: [...(a.attachments ?? [])]
      .sort((x, y) => x.id - y.id)
      .map((x) => ({ id: x.id, caption: x.caption, file: uploadDto(x.upload!), addedBy: x.createdBy?.name ?? null })),
    actions: [...(a.actions ?? [])].sort((x, y) => x.id - y.id).map(actionDto),
    history: [...(a.history ?? [])]
      .sort((x, y) => x.id - y.id)
      .map((h) => ({ id: h.id, userName: h.userName, at: h.createdAt.toISOString(), text: h.text })),
    closedAt: a.closedAt ? a.closedAt.toISOString() : null,
    closedBy: a.closedBy?.name ?? null,
  };
}

/** Matrices by id, resolved once per request. */
export function matrixCache(teamId: number, transaction?: Transaction) {
  const seen = new Map<string, Promise<ResolvedMatrix>>();
  return (id: string) => {
    if (!seen.has(id)) seen.set(id, resolveMatrix(teamId, id, transaction));
    return seen.get(id)!;
  };
}

export async function anomalyDtoFor(teamId: number, id: number, transaction?: Transaction): Promise<AnomalyDto> {
  const a = await findAnomaly(teamId, id, transaction);
  return anomalyDto(a, await resolveMatrix(teamId, a.matrixId, transaction));
}
