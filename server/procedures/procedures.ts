/** Loading, checking and presenting procedures and their revisions; the routes stay thin. */
import { randomBytes } from 'node:crypto';
import type { Transaction } from 'sequelize';
import type {
  AttachmentDto,
  PhaseParsed,
  ProcedureDto,
  ProcedureSummaryDto,
  RevisionDto,
  RevisionSummaryDto,
  SignoffDto,
  StationDto,
  StepDto,
} from '../../src/contract/procedures';
import { resolveCautions, type HazardForCautions, type PropellantForCautions, type ResolvedCaution } from '../../src/domain/procedures/cautions';
import { neededStations } from '../../src/domain/procedures/manning';
import { countability } from '../../src/domain/procedures/release';
import { normaliseStep, stepCount, type Phase, type Step } from '../../src/domain/procedures/steps';
import { formatTMinus } from '../../src/domain/procedures/tminus';
import { PROPELLANT_IDS, PROPELLANTS, type PropellantId } from '../../src/domain/propellants/library';
import { badRequest, notFound } from '../http/errors';
import { hazardCode } from '../hazards/hazards';
import {
  Hazard,
  Mitigation,
  Procedure,
  ProcedureAttachment,
  ProcedureRevision,
  ProcedureSignoff,
  PropellantCautionOverride,
  Station,
  Upload,
  User,
} from '../models';
import { uploadDto, type UploadStore } from '../uploads';

export const tx = <T>(fn: (t: Transaction) => Promise<T>) => Procedure.sequelize!.transaction(fn);

const REVISION_INCLUDE = [
  { model: ProcedureSignoff, as: 'signoffs' },
  {
    model: ProcedureAttachment,
    as: 'attachments',
    include: [
      { model: Upload, as: 'upload' },
      { model: User, as: 'createdBy', attributes: ['id', 'name'] },
    ],
  },
];

export async function findProcedure(teamId: number, id: number, transaction?: Transaction): Promise<Procedure> {
  const procedure = await Procedure.findOne({
    where: { id, teamId },
    include: [{ model: ProcedureRevision, as: 'revisions', include: REVISION_INCLUDE }],
    transaction,
  });
  if (!procedure) throw notFound('No such procedure.');
  return procedure;
}

export function revisionsOf(p: Procedure): ProcedureRevision[] {
  return [...(p.revisions ?? [])].sort((a, b) => a.number - b.number);
}

export function findRevision(p: Procedure, number: number): ProcedureRevision {
  const rev = revisionsOf(p).find((r) => r.number === number);
  if (!rev) throw notFound(`This procedure has no revision ${number}.`);
  return rev;
}

export function latestReleasedNumber(p: Procedure): number | null {
  const released = revisionsOf(p).filter((r) => r.status === 'released');
  return released.length ? released[released.length - 1]!.number : null;
}

/** A key for a new step or phase: random, so keys from two editors or two files do not collide. */
export function newKey(prefix: 's' | 'p'): string {
  return `${prefix}-${randomBytes(6).toString('base64url')}`;
}

/** Parsed phases with every missing key filled in and every step in its normal form. */
export function keyed(phases: readonly PhaseParsed[]): Phase[] {
  return phases.map((ph) => ({
    key: ph.key ?? newKey('p'),
    name: ph.name,
    steps: ph.steps.map((st) => normaliseStep({ ...st, key: st.key ?? newKey('s') } as Step)),
  }));
}

// ---------------------------------------------------------------- references

export async function stationsOf(teamId: number, transaction?: Transaction): Promise<Station[]> {
  return Station.findAll({ where: { teamId }, order: [['id', 'ASC']], transaction });
}

export function stationDto(s: Station): StationDto {
  return {
    id: s.id,
    code: s.code,
    name: s.name,
    callSign: s.callSign,
    defaultPpe: s.defaultPpe,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  };
}

/** The team's station codes and hazards, for checking what steps refer to. */
export async function referencesOf(teamId: number, transaction?: Transaction) {
  const [stations, hazards] = await Promise.all([
    stationsOf(teamId, transaction),
    Hazard.findAll({ where: { teamId }, attributes: ['id', 'number'], transaction }),
  ]);
  return {
    stations: new Set(stations.map((s) => s.code)),
    hazardIds: new Set(hazards.map((h) => h.id)),
    hazardsByCode: new Map(hazards.map((h) => [hazardCode(h.number), h.id])),
    hazardCodeById: new Map(hazards.map((h) => [h.id, hazardCode(h.number)])),
    stationRows: stations,
  };
}

/** Refuses procedure-level station codes the team does not have, each at its index. */
export function checkListedStations(codes: readonly string[], known: ReadonlySet<string>, path = 'stations'): void {
  const details = codes.flatMap((c, i) => (known.has(c) ? [] : [{ path: `${path}.${i}`, message: `There is no station with the short code ${c}.` }]));
  if (details.length) throw badRequest('Some stations are not in your team.', 'validation_failed', details);
}

// ---------------------------------------------------------------- cautions

export interface CautionContext {
  hazards: Map<number, HazardForCautions>;
  propellants: Map<PropellantId, PropellantForCautions>;
}

/** The team's hazards with mitigations and its propellant cautions (edited ones where the safety officer edited them). */
export async function cautionContext(teamId: number, transaction?: Transaction): Promise<CautionContext> {
  const [hazards, overrides] = await Promise.all([
    Hazard.findAll({ where: { teamId }, include: [{ model: Mitigation, as: 'mitigations' }], transaction }),
    PropellantCautionOverride.findAll({ where: { teamId }, transaction }),
  ]);
  const propellants = new Map<PropellantId, PropellantForCautions>();
  for (const id of PROPELLANT_IDS) {
    const p = PROPELLANTS[id];
    const o = overrides.find((x) => x.propellantId === id);
    // PPE items carry their source in the library; a step's PPE note needs only the words.
    const ppe = (o?.ppe ?? p.ppe).map((item) => (typeof item === 'string' ? item : item.text));
    propellants.set(id, { id, name: p.name, cautions: o?.cautions ?? p.cautions, ppe });
  }
  return {
    hazards: new Map(
      hazards.map((h) => [
        h.id,
        {
          id: h.id,
          code: hazardCode(h.number),
          status: h.status,
          mitigations: [...(h.mitigations ?? [])]
            .sort((a, b) => a.id - b.id)
            .map((m) => ({ id: m.id, kind: m.kind, description: m.description, verificationStatus: m.verificationStatus })),
        },
      ]),
    ),
    propellants,
  };
}

export function currentCautions(phases: readonly Phase[], ctx: CautionContext): Record<string, ResolvedCaution[]> {
  const out: Record<string, ResolvedCaution[]> = {};
  for (const ph of phases) for (const st of ph.steps) out[st.key] = resolveCautions(st, ctx.hazards, ctx.propellants);
  return out;
}

// ---------------------------------------------------------------- attachments

export function stepKeysOf(phases: readonly Phase[]): Set<string> {
  return new Set(phases.flatMap((ph) => ph.steps.map((st) => st.key)));
}

/**
 * Deletes these uploads (row now, file after commit) unless some revision's attachment still links to one.
 * Call it after the links that were going have been destroyed in the same transaction.
 */
export async function removeUnusedUploads(store: UploadStore, files: readonly Upload[], transaction: Transaction): Promise<void> {
  const seen = new Set<number>();
  for (const upload of files) {
    if (seen.has(upload.id)) continue;
    seen.add(upload.id);
    if ((await ProcedureAttachment.count({ where: { uploadId: upload.id }, transaction })) === 0) await store.remove(upload, transaction);
  }
}

export function attachmentDtos(rev: ProcedureRevision): AttachmentDto[] {
  const keys = stepKeysOf(rev.phases);
  return [...(rev.attachments ?? [])]
    .sort((a, b) => a.id - b.id)
    .map((a) => ({
      id: a.id,
      stepKey: a.stepKey,
      stepRemoved: a.stepKey !== null && !keys.has(a.stepKey),
      caption: a.caption,
      file: uploadDto(a.upload!),
      addedBy: a.createdBy?.name ?? null,
      createdAt: a.createdAt.toISOString(),
    }));
}

// ---------------------------------------------------------------- DTOs

export function signoffDtos(rev: ProcedureRevision): SignoffDto[] {
  return [...(rev.signoffs ?? [])]
    .sort((a, b) => a.id - b.id)
    .map((s) => ({ role: s.role, userId: s.userId, userName: s.userName, at: s.createdAt.toISOString() }));
}

function revisionSummary(rev: ProcedureRevision): RevisionSummaryDto {
  return {
    id: rev.id,
    number: rev.number,
    status: rev.status,
    releasedAt: rev.releasedAt ? rev.releasedAt.toISOString() : null,
    signoffs: signoffDtos(rev),
  };
}

export function procedureSummary(p: Procedure): ProcedureSummaryDto {
  const revisions = revisionsOf(p);
  const released = revisions.filter((r) => r.status === 'released');
  const latest = released[released.length - 1];
  const draft = revisions.find((r) => r.status === 'draft');
  return {
    id: p.id,
    name: p.name,
    purpose: p.purpose,
    testArticle: p.testArticle,
    site: p.site,
    stations: p.stations,
    latestReleased: latest ? { number: latest.number, releasedAt: latest.releasedAt!.toISOString() } : null,
    draft: draft ? { number: draft.number } : null,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
  };
}

export function procedureDto(p: Procedure): ProcedureDto {
  return { ...procedureSummary(p), revisions: revisionsOf(p).map(revisionSummary) };
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

export function revisionDto(p: Procedure, rev: ProcedureRevision, ctx: CautionContext): RevisionDto {
  const now = currentCautions(rev.phases, ctx);
  const frozen = rev.status === 'released' ? rev.releasedCautions : null;
  let changed = false;
  const phases = rev.phases.map((ph) => ({
    key: ph.key,
    name: ph.name,
    steps: ph.steps.map((st): StepDto => {
      const current = now[st.key] ?? [];
      const signed = frozen?.[st.key];
      if (signed !== undefined && !same(signed, current)) changed = true;
      return { ...st, t: st.tSeconds === null ? null : formatTMinus(st.tSeconds), cautions: signed ?? current };
    }),
  }));
  const c = countability({ status: rev.status, number: rev.number, stepCount: stepCount(rev.phases) }, latestReleasedNumber(p));
  return {
    id: rev.id,
    procedureId: p.id,
    number: rev.number,
    status: rev.status,
    basedOn: rev.basedOn,
    phases,
    signoffs: signoffDtos(rev),
    releasedAt: rev.releasedAt ? rev.releasedAt.toISOString() : null,
    countable: c.countable,
    notCountableReason: c.countable ? null : c.message,
    cautionsChangedSinceRelease: changed,
    neededStations: neededStations(rev.phases, p.stations),
    attachments: attachmentDtos(rev),
    createdAt: rev.createdAt.toISOString(),
    updatedAt: rev.updatedAt.toISOString(),
  };
}

export async function revisionDtoFor(teamId: number, procedureId: number, number: number, transaction?: Transaction): Promise<RevisionDto> {
  const p = await findProcedure(teamId, procedureId, transaction);
  return revisionDto(p, findRevision(p, number), await cautionContext(teamId, transaction));
}

/** Every station code any of the team's procedures or revisions uses, with where. */
export async function stationUses(teamId: number, code: string, transaction?: Transaction): Promise<string[]> {
  const procedures = await Procedure.findAll({
    where: { teamId },
    include: [{ model: ProcedureRevision, as: 'revisions' }],
    transaction,
  });
  const uses: string[] = [];
  for (const p of procedures) {
    if (p.stations.includes(code)) uses.push(`${p.name} (listed stations)`);
    for (const r of revisionsOf(p)) if (neededStations(r.phases).includes(code)) uses.push(`${p.name}, revision ${r.number}`);
  }
  return uses;
}

/**
 * A new draft revision from the latest one: its phases, and its diagrams (the same uploads, linked again). The
 * caller has checked that no draft is open. Used by "new revision" and by lessons learned from an anomaly.
 */
export async function openDraft(p: Procedure, userId: number, transaction: Transaction): Promise<ProcedureRevision> {
  const revisions = revisionsOf(p);
  const latest = revisions[revisions.length - 1]!;
  const draft = await ProcedureRevision.create(
    {
      procedureId: p.id,
      number: latest.number + 1,
      status: 'draft',
      basedOn: latest.number,
      phases: latest.phases,
      releasedCautions: null,
      releasedAt: null,
      createdById: userId,
      updatedById: userId,
    },
    { transaction },
  );
  await ProcedureAttachment.bulkCreate(
    (latest.attachments ?? []).map((a) => ({ revisionId: draft.id, stepKey: a.stepKey, uploadId: a.uploadId, caption: a.caption, createdById: a.createdById })),
    { transaction },
  );
  return draft;
}
