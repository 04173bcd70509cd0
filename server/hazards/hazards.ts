/** Loading, checking and presenting hazards; the routes stay thin. */
import type { Transaction } from 'sequelize';
import type { AcceptanceProgressDto, EvidenceDto, HazardCreateInputParsed, HazardDto, MitigationDto } from '../../src/contract/hazards';
import { BUILT_IN_MATRIX_ID } from '../../src/contract/hazards';
import { acceptanceProgress } from '../../src/domain/hazards/acceptance';
import { MatrixKeyError, riskLevel } from '../../src/domain/hazards/matrix';
import { byPrecedence, checkResidual, type MitigationKind } from '../../src/domain/hazards/mitigation';
import { badRequest, notFound } from '../http/errors';
import { Hazard, HazardAcceptance, HazardHistory, Mitigation, MitigationEvidence, Upload, User } from '../models';
import { uploadDto } from '../uploads';
import { defaultMatrixId, resolveMatrix, severityOut, type ResolvedMatrix } from './matrices';

export const hazardCode = (n: number) => `HZ-${String(n).padStart(3, '0')}`;

export const HAZARD_INCLUDE = [
  {
    model: Mitigation,
    as: 'mitigations',
    include: [
      {
        model: MitigationEvidence,
        as: 'evidence',
        include: [
          { model: Upload, as: 'upload' },
          { model: User, as: 'createdBy', attributes: ['id', 'name'] },
        ],
      },
    ],
  },
  { model: HazardAcceptance, as: 'acceptances' },
];

export async function findHazard(teamId: number, id: number, transaction?: Transaction): Promise<Hazard> {
  const hazard = await Hazard.findOne({ where: { id, teamId }, include: HAZARD_INCLUDE, transaction });
  if (!hazard) throw notFound('No such hazard.');
  return hazard;
}

export interface Actor {
  id: number;
  name: string;
}

/** Appends one history line. `before`/`after` are stored as JSON. */
export async function record(
  hazardId: number,
  actor: Actor,
  field: string,
  before: unknown,
  after: unknown,
  transaction?: Transaction,
): Promise<void> {
  await HazardHistory.create(
    { hazardId, userId: actor.id, userName: actor.name, field, before: before ?? null, after: after ?? null },
    { transaction },
  );
}

export interface RiskFields {
  matrixId: string;
  initialSeverity: string;
  initialLikelihood: string;
  residualSeverity: string | null;
  residualLikelihood: string | null;
}

function levelOrNull(m: ResolvedMatrix, sev: string | null, lik: string | null): string | null {
  if (sev === null || lik === null) return null;
  try {
    return riskLevel(m.matrix, sev, lik).key;
  } catch (error) {
    if (error instanceof MatrixKeyError) return null;
    throw error;
  }
}

/**
 * Refuses risk fields the matrix does not have, a half-given residual, and a residual the
 * mitigations cannot justify (MIL-STD-882E 4.3.4 via checkResidual; built-in matrix only,
 * since a team matrix's likelihood order is its own).
 */
export async function checkRiskFields(
  teamId: number,
  f: RiskFields,
  kinds: readonly MitigationKind[],
  transaction?: Transaction,
): Promise<ResolvedMatrix> {
  const m = await resolveMatrix(teamId, f.matrixId, transaction);
  const details: { path: string; message: string }[] = [];
  const sevOk = (k: string) => m.matrix.severities.some((s) => s.key === k);
  const likOk = (k: string) => m.matrix.likelihoods.some((l) => l.key === k);
  const sevList = m.matrix.severities.map((s) => s.key).join(', ');
  const likList = m.matrix.likelihoods.map((l) => l.key).join(', ');
  if (!sevOk(f.initialSeverity)) details.push({ path: 'initialSeverity', message: `Severity must be one of ${sevList}.` });
  if (!likOk(f.initialLikelihood)) details.push({ path: 'initialLikelihood', message: `Likelihood must be one of ${likList}.` });
  if (f.residualSeverity !== null && !sevOk(f.residualSeverity)) details.push({ path: 'residualSeverity', message: `Severity must be one of ${sevList}.` });
  if (f.residualLikelihood !== null && !likOk(f.residualLikelihood)) details.push({ path: 'residualLikelihood', message: `Likelihood must be one of ${likList}.` });
  if ((f.residualSeverity === null) !== (f.residualLikelihood === null)) {
    details.push({ path: f.residualSeverity === null ? 'residualSeverity' : 'residualLikelihood', message: 'Give both residual severity and likelihood, or neither.' });
  }
  if (details.length) throw badRequest(`Those risk values do not fit the matrix '${m.matrix.name}'.`, 'invalid_risk', details);
  if (m.matrix.id === BUILT_IN_MATRIX_ID && f.residualLikelihood !== null) {
    const check = checkResidual({ initialLikelihood: f.initialLikelihood, residualLikelihood: f.residualLikelihood, mitigations: kinds.map((kind) => ({ kind })) });
    if (!check.ok) {
      throw badRequest(check.message, check.code.replaceAll('-', '_'), [{ path: 'residualLikelihood', message: check.message }]);
    }
  }
  return m;
}

export function riskFieldsOf(h: Hazard): RiskFields {
  return {
    matrixId: h.matrixId,
    initialSeverity: h.initialSeverity,
    initialLikelihood: h.initialLikelihood,
    residualSeverity: h.residualSeverity,
    residualLikelihood: h.residualLikelihood,
  };
}

export function residualLevel(h: Hazard, m: ResolvedMatrix): string | null {
  return levelOrNull(m, h.residualSeverity, h.residualLikelihood);
}

function evidenceDto(e: MitigationEvidence): EvidenceDto {
  return {
    id: e.id,
    kind: e.kind,
    label: e.label,
    data: e.data,
    file: e.upload ? uploadDto(e.upload) : null,
    addedBy: e.createdBy?.name ?? null,
    createdAt: e.createdAt.toISOString(),
  };
}

/** What the history keeps about a piece of evidence, so a removal still says what was there. */
export function evidenceFacts(e: MitigationEvidence): Record<string, unknown> {
  if (e.kind === 'file' && e.upload) {
    const u = e.upload;
    return { id: e.id, kind: 'file', label: e.label, name: u.originalName, mediaType: u.mediaType, sizeBytes: u.sizeBytes, sha256: u.sha256 };
  }
  const calc = (e.data as { calc?: unknown }).calc;
  return { id: e.id, kind: e.kind, label: e.label, ...(calc ? { calc } : {}) };
}

export function mitigationDto(mit: Mitigation): MitigationDto {
  return {
    id: mit.id,
    kind: mit.kind,
    description: mit.description,
    owner: mit.owner,
    verificationMethod: mit.verificationMethod,
    verificationStatus: mit.verificationStatus,
    evidence: [...(mit.evidence ?? [])].sort((a, b) => a.id - b.id).map(evidenceDto),
  };
}

export function progressFor(h: Hazard, m: ResolvedMatrix): AcceptanceProgressDto | null {
  const level = residualLevel(h, m);
  if (level === null) return null;
  const required = [...(m.acceptanceMap[level] ?? [])];
  const current = (h.acceptances ?? []).filter((a) => a.riskLevel === level);
  const p = acceptanceProgress(m.acceptanceMap, level, current.map((a) => ({ userId: String(a.userId), role: a.role })));
  return { requiredRoles: required, missingRoles: p.missingRoles, complete: p.complete };
}

export function hazardDto(h: Hazard, m: ResolvedMatrix): HazardDto {
  const mitigations = byPrecedence([...(h.mitigations ?? [])].sort((a, b) => a.id - b.id));
  return {
    id: h.id,
    code: hazardCode(h.number),
    title: h.title,
    system: h.system,
    phase: h.phase,
    description: h.description,
    causes: h.causes,
    effects: h.effects,
    propellants: h.propellants,
    energies: h.energies,
    matrixId: h.matrixId,
    initialSeverity: severityOut(h.matrixId, h.initialSeverity),
    initialLikelihood: h.initialLikelihood,
    initialRisk: levelOrNull(m, h.initialSeverity, h.initialLikelihood) ?? 'unknown',
    residualSeverity: h.residualSeverity === null ? null : severityOut(h.matrixId, h.residualSeverity),
    residualLikelihood: h.residualLikelihood,
    residualRisk: residualLevel(h, m),
    status: h.status,
    mitigations: mitigations.map(mitigationDto),
    acceptances: [...(h.acceptances ?? [])]
      .sort((a, b) => a.id - b.id)
      .map((a) => ({ userId: a.userId, userName: a.userName, role: a.role, at: a.createdAt.toISOString() })),
    acceptanceProgress: progressFor(h, m),
    createdAt: h.createdAt.toISOString(),
    updatedAt: h.updatedAt.toISOString(),
  };
}

export async function hazardDtoFor(teamId: number, id: number, transaction?: Transaction): Promise<HazardDto> {
  const h = await findHazard(teamId, id, transaction);
  return hazardDto(h, await resolveMatrix(teamId, h.matrixId, transaction));
}

export function refuseRetired(m: ResolvedMatrix) {
  if (m.retiredAt !== null) {
    const message = `The matrix '${m.matrix.name}' is retired: choose another matrix for this assessment.`;
    throw badRequest(message, 'matrix_retired', [{ path: 'matrixId', message }]);
  }
}

/** Adds a hazard to the register (checked, numbered, its creation in the history); the caller's transaction. */
export async function createHazard(teamId: number, actor: Actor, body: HazardCreateInputParsed, t: Transaction): Promise<Hazard> {
  const risk: RiskFields = {
    matrixId: body.matrixId ?? (await defaultMatrixId(teamId, t)),
    initialSeverity: body.initialSeverity,
    initialLikelihood: body.initialLikelihood,
    residualSeverity: body.residualSeverity ?? null,
    residualLikelihood: body.residualLikelihood ?? null,
  };
  // A new hazard has no mitigations, so a lowered residual is refused here.
  refuseRetired(await checkRiskFields(teamId, risk, [], t));
  const last = (await Hazard.max('number', { where: { teamId }, transaction: t })) as number | null;
  const h = await Hazard.create({ ...body, ...risk, teamId, number: (last ?? 0) + 1, createdById: actor.id }, { transaction: t });
  await record(h.id, actor, 'created', null, { code: hazardCode(h.number), title: h.title }, t);
  return h;
}
