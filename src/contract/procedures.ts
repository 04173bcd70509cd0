/**
 * Procedure templates contract: stations, crew plans, procedures and their revisions, and the versioned JSON
 * exchange format (docs/procedures.md). Structure is checked here with zod; the authoring rules come from
 * src/domain/procedures and are reported through the same issues, every problem at once, each at its path.
 */
import { z } from 'zod';
import type { ResolvedCaution } from '../domain/procedures/cautions';
import type { RevisionDiff } from '../domain/procedures/diff';
import type { ManningCheck } from '../domain/procedures/manning';
import type { Role } from '../domain/people/roles';
import { REVISION_STATUSES, SIGNOFF_ROLES, type RevisionStatus, type SignoffRole } from '../domain/procedures/release';
import {
  PERSONNEL_CHECKS,
  referenceProblems,
  sequenceProblems,
  stepProblems,
  type Phase,
  type Problem,
  type SequenceStep,
  type Step,
} from '../domain/procedures/steps';
import { formatTMinus, MAX_COUNT_SECONDS, parseTMinus, T_MINUS_HINT } from '../domain/procedures/tminus';
import { PROPELLANT_IDS, type PropellantId } from '../domain/propellants/library';
import type { UploadDto } from './uploads';

export const MAX_PHASES = 20;
export const MAX_STEPS_PER_PHASE = 200;
export const MAX_STEPS = 500;

// ---------------------------------------------------------------- small pieces

const text = (max: number, what: string) =>
  z.string().trim().min(1, `Enter ${what}`).max(max, `Use at most ${max} characters`);
const optionalText = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const idString = z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number);
const positiveId = z.number().int().positive().max(999_999_999);

/** A station's short code: 2 to 8 capital letters or digits, starting with a letter (TC, PROP, FIRE1). */
export const stationCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z][A-Z0-9]{1,7}$/, 'Use 2 to 8 capital letters or digits, starting with a letter');
export const stepKeySchema = z.string().regex(/^[A-Za-z0-9_-]{1,40}$/, 'Use up to 40 letters, digits, dashes or underscores');
export const hazardCodeSchema = z.string().trim().toUpperCase().regex(/^HZ-\d{3,6}$/, 'Write a hazard code like HZ-003');
const propellantIdSchema = z.enum(PROPELLANT_IDS);
const ppeList = z.array(text(300, 'a PPE item')).max(20, 'List at most 20');

// ---------------------------------------------------------------- stations

export const stationInputSchema = z.strictObject({
  code: stationCodeSchema,
  name: text(80, 'a name'),
  callSign: text(40, 'a call sign'),
  defaultPpe: ppeList.default([]),
});
export type StationInput = z.input<typeof stationInputSchema>;

export const stationUpdateInputSchema = z
  .strictObject({
    code: stationCodeSchema.optional(),
    name: text(80, 'a name').optional(),
    callSign: text(40, 'a call sign').optional(),
    defaultPpe: ppeList.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field to change');
export type StationUpdateInput = z.input<typeof stationUpdateInputSchema>;

export interface StationDto {
  id: number;
  code: string;
  name: string;
  callSign: string;
  defaultPpe: string[];
  createdAt: string;
  updatedAt: string;
}

// ---------------------------------------------------------------- crew plans

export const crewPlanInputSchema = z.strictObject({
  name: text(120, 'a name'),
  /** The procedure the crew is planned for, or null for a test day's general plan. */
  procedureId: positiveId.nullable().default(null),
  testDate: z.iso.date('Use a date like 2025-05-17').nullable().default(null),
  notes: optionalText(2000).default(''),
  assignments: z
    .array(z.strictObject({ stationId: positiveId, userId: positiveId }))
    .max(200, 'List at most 200 assignments')
    .default([]),
});
export type CrewPlanInput = z.input<typeof crewPlanInputSchema>;

export interface CrewAssignmentDto {
  stationId: number;
  stationCode: string;
  stationName: string;
  userId: number;
  userName: string;
  active: boolean;
}

export interface CrewPlanDto {
  id: number;
  name: string;
  procedureId: number | null;
  procedureName: string | null;
  testDate: string | null;
  notes: string;
  assignments: CrewAssignmentDto[];
  createdAt: string;
  updatedAt: string;
}

/** A person who can be put on a crew (GET /api/crew-plans/people). */
export interface CrewPersonDto {
  id: number;
  name: string;
  roles: Role[];
}

export const manningQuerySchema = z.strictObject({
  /** Defaults to the plan's own procedure. */
  procedureId: idString.optional(),
  /** Defaults to the latest released revision, or the draft when none is released yet. */
  revision: idString.optional(),
});

export interface ManningDto extends ManningCheck {
  crewPlanId: number;
  procedureId: number;
  revisionNumber: number;
  /** Needed station codes the team has no station for. */
  unknownStations: string[];
}

// ---------------------------------------------------------------- procedures

export const procedureCreateInputSchema = z.strictObject({
  name: text(160, 'a name'),
  purpose: optionalText(2000).default(''),
  testArticle: optionalText(160).default(''),
  site: optionalText(160).default(''),
  /** Stations involved beyond those the steps name (a standby fire crew, say). */
  stations: z.array(stationCodeSchema).max(30).default([]),
});
export type ProcedureCreateInput = z.input<typeof procedureCreateInputSchema>;

export const procedureUpdateInputSchema = z
  .strictObject({
    name: text(160, 'a name').optional(),
    purpose: optionalText(2000).optional(),
    testArticle: optionalText(160).optional(),
    site: optionalText(160).optional(),
    stations: z.array(stationCodeSchema).max(30).optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field to change');
export type ProcedureUpdateInput = z.input<typeof procedureUpdateInputSchema>;

export const procedureParamSchema = z.strictObject({ id: idString });
/** :rev is the revision number (1, 2, ...), as printed on the procedure. */
export const revisionParamSchema = z.strictObject({ id: idString, rev: idString });
export const ATTACHMENT_CAPTION_MAX = 200;
export const attachmentParamSchema = z.strictObject({ id: idString, rev: idString, attachmentId: idString });
/** The text fields sent with an attachment's file (multipart). An empty stepKey means the whole procedure. */
export const attachmentInputSchema = z.strictObject({
  caption: optionalText(ATTACHMENT_CAPTION_MAX).default(''),
  stepKey: z
    .union([z.literal(''), stepKeySchema])
    .optional()
    .transform((k) => k || null),
});
export type AttachmentInput = z.input<typeof attachmentInputSchema>;
export const diffQuerySchema = z.strictObject({ from: idString, to: idString });
export const signoffInputSchema = z.strictObject({ as: z.enum(SIGNOFF_ROLES) });
export type SignoffInput = z.input<typeof signoffInputSchema>;

// ---------------------------------------------------------------- steps

const time = z
  .number({ error: 'Give the time as signed seconds from T-0 (T-30:00 is -1800), or null' })
  .int('Use whole seconds')
  .min(-MAX_COUNT_SECONDS, 'Keep within seven days of T-0')
  .max(MAX_COUNT_SECONDS, 'Keep within seven days of T-0')
  .nullable();
const limit = z.number().finite().nullable().default(null);

/** The kind-specific fields, written once for the API and the exchange file. */
function stepUnion<B extends z.ZodRawShape>(base: B) {
  return z.discriminatedUnion(
    'kind',
    [
      z.strictObject({ ...base, kind: z.literal('action') }),
      z.strictObject({ ...base, kind: z.literal('verification') }),
      z.strictObject({ ...base, kind: z.literal('reading'), unit: optionalText(20), min: limit, max: limit }),
      z.strictObject({ ...base, kind: z.literal('poll'), stations: z.array(stationCodeSchema).max(30, 'List at most 30') }),
      z.strictObject({ ...base, kind: z.literal('builtInHold'), durationSeconds: z.number().int('Use whole seconds') }),
      z.strictObject({
        ...base,
        kind: z.literal('personnelCheck'),
        checks: z.array(z.enum(PERSONNEL_CHECKS)).max(PERSONNEL_CHECKS.length),
        zone: optionalText(200).default(''),
      }),
    ],
    { error: 'Choose a step kind: action, verification, reading, poll, builtInHold or personnelCheck' },
  );
}

const sharedStepFields = {
  /** Omit on a new step: the server gives it one, kept from then on. */
  key: stepKeySchema.optional(),
  station: stationCodeSchema,
  instruction: text(2000, 'the instruction'),
  propellants: z.array(propellantIdSchema).max(PROPELLANT_IDS.length).default([]),
  note: optionalText(1000).default(''),
};

export const stepInputSchema = stepUnion({
  ...sharedStepFields,
  tSeconds: time,
  hazardIds: z.array(positiveId).max(20, 'Link at most 20 hazards').default([]),
});
export type StepInput = z.input<typeof stepInputSchema>;
type StepParsed = z.output<typeof stepInputSchema>;

const phaseKey = stepKeySchema;
const phaseInputSchema = z.strictObject({
  key: phaseKey.optional(),
  name: text(120, 'a phase name'),
  steps: z.array(stepInputSchema).max(MAX_STEPS_PER_PHASE, `Keep a phase to ${MAX_STEPS_PER_PHASE} steps`),
});
export type PhaseInput = z.input<typeof phaseInputSchema>;
/** A phase as parsed: keys may still be missing until the server assigns them. */
export type PhaseParsed = z.output<typeof phaseInputSchema>;

// ---------------------------------------------------------------- the rules, through zod

const always = { when: () => true };
type Issue = { path: (string | number)[]; message: string };
type Ctx = { addIssue(issue: { code: 'custom'; message: string; path: (string | number)[] }): void };

const toPath = (prefix: (string | number)[], rel: string, rename: Record<string, string>) => [
  ...prefix,
  ...rel.split('.').map((part, i) => (i === 0 ? (rename[part] ?? part) : /^\d+$/.test(part) ? Number(part) : part)),
];

interface StepReader {
  /** The structural schema for one step. */
  schema: z.ZodType;
  /** A domain step from parsed data; report() adds problems the reader itself finds. */
  toStep(data: unknown, report: (rel: string, message: string) => void): Step;
  /** Domain field names as this format spells them. */
  rename: Record<string, string>;
}

/** Reads whatever parsed of a revision's phases, and reports every rule it breaks. */
function checkContent(reader: StepReader, refs: { stations: ReadonlySet<string>; hazardIds?: ReadonlySet<number> } | undefined) {
  return (value: unknown, ctx: Ctx) => {
    const issues: Issue[] = [];
    const phasesRaw = Array.isArray((value as { phases?: unknown } | null)?.phases) ? ((value as { phases: unknown[] }).phases) : [];
    const seq: { key?: string; name?: string; steps: (SequenceStep | null)[] }[] = [];
    const readable: { steps: (Step | null)[] }[] = [];
    let total = 0;
    phasesRaw.forEach((phase, p) => {
      const ph = (phase ?? {}) as { key?: unknown; name?: unknown; steps?: unknown };
      const stepsRaw = Array.isArray(ph.steps) ? ph.steps : [];
      total += stepsRaw.length;
      const steps = stepsRaw.map((raw, s) => {
        const parsed = reader.schema.safeParse(raw);
        if (!parsed.success) return null;
        const prefix = ['phases', p, 'steps', s];
        const step = reader.toStep(parsed.data, (rel, message) => issues.push({ path: toPath(prefix, rel, {}), message }));
        for (const pr of stepProblems(step)) issues.push({ path: toPath(prefix, pr.path, reader.rename), message: pr.message });
        return step;
      });
      readable.push({ steps });
      seq.push({
        key: typeof ph.key === 'string' ? ph.key : undefined,
        name: typeof ph.name === 'string' ? ph.name : undefined,
        steps: steps.map((st) => (st === null ? null : { key: st.key === '' ? undefined : st.key, tSeconds: st.tSeconds })),
      });
    });
    const relative = (pr: Problem) => {
      const [, p, , s, ...rest] = pr.path.split('.');
      return rest.length && s !== undefined
        ? toPath(['phases', Number(p), 'steps', Number(s)], rest.join('.'), reader.rename)
        : toPath([], pr.path, {});
    };
    for (const pr of sequenceProblems(seq)) issues.push({ path: relative(pr), message: pr.message });
    if (refs) for (const pr of referenceProblems(readable, refs)) issues.push({ path: relative(pr), message: pr.message });
    if (total > MAX_STEPS) issues.push({ path: ['phases'], message: `Keep a procedure to ${MAX_STEPS} steps; this one has ${total}.` });
    for (const issue of issues) ctx.addIssue({ code: 'custom', message: issue.message, path: issue.path });
  };
}

function apiStep(data: StepParsed): Step {
  return { ...data, key: data.key ?? '' } as Step;
}

const apiReader: StepReader = {
  schema: stepInputSchema,
  toStep: (data) => apiStep(data as StepParsed),
  rename: {},
};

/**
 * PUT /api/procedures/:id/revisions/:rev: the draft's phases and steps, in order. With `refs` the team's
 * station codes and hazard ids are checked too.
 */
export function revisionContentSchema(refs?: { stations: ReadonlySet<string>; hazardIds?: ReadonlySet<number> }) {
  return z
    .strictObject({ phases: z.array(phaseInputSchema).max(MAX_PHASES, `Keep a procedure to ${MAX_PHASES} phases`) })
    .superRefine(checkContent(apiReader, refs), always as never);
}
export const revisionContentInputSchema = revisionContentSchema();
export type RevisionContentInput = z.input<typeof revisionContentInputSchema>;

// ---------------------------------------------------------------- response DTOs

export interface SignoffDto {
  role: SignoffRole;
  userId: number;
  userName: string;
  at: string;
}

export interface RevisionSummaryDto {
  id: number;
  number: number;
  status: RevisionStatus;
  releasedAt: string | null;
  signoffs: SignoffDto[];
}

export interface ProcedureSummaryDto {
  id: number;
  name: string;
  purpose: string;
  testArticle: string;
  site: string;
  stations: string[];
  latestReleased: { number: number; releasedAt: string } | null;
  draft: { number: number } | null;
  createdAt: string;
  updatedAt: string;
}

export interface ProcedureDto extends ProcedureSummaryDto {
  revisions: RevisionSummaryDto[];
}

/** A step as stored, with its count time written out and its resolved cautions. */
export type StepDto = Step & { t: string | null; cautions: ResolvedCaution[] };

export interface PhaseDto {
  key: string;
  name: string;
  steps: StepDto[];
}

/** A diagram or photo on a revision. */
export interface AttachmentDto {
  id: number;
  /** The step it belongs to, or null for the whole procedure. */
  stepKey: string | null;
  /**
   * True when stepKey names a step this revision no longer has (the step was deleted after the file was
   * attached): the file is then shown with the procedure-level ones, with a note.
   */
  stepRemoved: boolean;
  caption: string;
  file: UploadDto;
  addedBy: string | null;
  createdAt: string;
}

export interface RevisionDto {
  id: number;
  procedureId: number;
  number: number;
  status: RevisionStatus;
  /** The revision this one was copied from. */
  basedOn: number | null;
  phases: PhaseDto[];
  signoffs: SignoffDto[];
  releasedAt: string | null;
  /** Only the latest released revision can be counted. */
  countable: boolean;
  notCountableReason: string | null;
  /**
   * A released revision keeps the cautions it was signed with. True when the hazard register or the
   * propellant cautions have changed since: open a new revision to bring them in.
   */
  cautionsChangedSinceRelease: boolean;
  neededStations: string[];
  /** Diagrams and photos, oldest first. Not part of the JSON exchange format. */
  attachments: AttachmentDto[];
  createdAt: string;
  updatedAt: string;
}

export interface RevisionSaveDto extends RevisionDto {
  /** True when saving changed a draft someone had already signed: their sign-off no longer stands. */
  signoffsCleared: boolean;
}

export interface DiffDto extends RevisionDiff {
  from: number;
  to: number;
}

export { REVISION_STATUSES, SIGNOFF_ROLES };
export type { Phase, RevisionStatus, SignoffRole, Step };

// ---------------------------------------------------------------- exchange format, version 1

export const PROCEDURE_FORMAT = 'holdfire.procedure';
export const PROCEDURE_FORMAT_VERSION = 1;

const fileStepSchema = stepUnion({
  ...sharedStepFields,
  /** 'T-30:00', 'T+5:00', 'T-2:00:00', or null for an untimed step. */
  t: z.string().max(20).nullable(),
  /** Hazard codes of the importing team's register. */
  hazards: z.array(hazardCodeSchema).max(20, 'Link at most 20 hazards').default([]),
});
type FileStepParsed = z.output<typeof fileStepSchema>;

const filePhaseSchema = z.strictObject({
  key: phaseKey.optional(),
  name: text(120, 'a phase name'),
  steps: z.array(fileStepSchema).max(MAX_STEPS_PER_PHASE, `Keep a phase to ${MAX_STEPS_PER_PHASE} steps`),
});

export interface FileReferences {
  stations: ReadonlySet<string>;
  hazardsByCode: ReadonlyMap<string, number>;
}

function fileReader(refs: FileReferences | undefined): StepReader {
  return {
    schema: fileStepSchema,
    rename: { tSeconds: 't', hazardIds: 'hazards' },
    toStep(data, report) {
      const { t, hazards, ...rest } = data as FileStepParsed;
      let tSeconds: number | null = null;
      if (t !== null) {
        const parsed = parseTMinus(t);
        if (parsed === undefined) report('t', `'${t}' is not a count time. ${T_MINUS_HINT}`);
        else tSeconds = parsed;
      }
      const hazardIds: number[] = [];
      hazards.forEach((code, i) => {
        const id = refs?.hazardsByCode.get(code);
        if (id !== undefined) hazardIds.push(id);
        else if (refs) report(`hazards.${i}`, `There is no hazard ${code} in your register.`);
      });
      return { ...rest, key: rest.key ?? '', tSeconds, hazardIds } as Step;
    },
  };
}

/** Informational parts of a file: written on export, not read back. */
const fileSignoffSchema = z.looseObject({ role: z.string().max(20), name: z.string().max(120), at: z.string().max(40) });
const fileStationSchema = z.looseObject({
  code: z.string().max(8),
  name: z.string().max(80),
  callSign: z.string().max(40),
  defaultPpe: z.array(z.string().max(300)).max(20).optional(),
});

export function procedureDocumentSchema(refs?: FileReferences) {
  return z
    .strictObject({
      format: z.literal(PROCEDURE_FORMAT, { error: `This is not a Holdfire procedure file: "format" must be "${PROCEDURE_FORMAT}".` }),
      version: z.literal(PROCEDURE_FORMAT_VERSION, {
        error: `This Holdfire reads procedure files of version ${PROCEDURE_FORMAT_VERSION}.`,
      }),
      exportedAt: z.string().max(40).optional(),
      procedure: z.strictObject({
        name: text(160, 'a name'),
        purpose: optionalText(2000).default(''),
        testArticle: optionalText(160).default(''),
        site: optionalText(160).default(''),
        stations: z.array(stationCodeSchema).max(30).default([]),
      }),
      revision: z
        .looseObject({
          number: z.number().int().optional(),
          status: z.string().max(20).optional(),
          releasedAt: z.string().max(40).nullable().optional(),
          signoffs: z.array(fileSignoffSchema).max(10).optional(),
        })
        .optional(),
      stations: z.array(fileStationSchema).max(50).optional(),
      phases: z.array(filePhaseSchema).max(MAX_PHASES, `Keep a procedure to ${MAX_PHASES} phases`),
    })
    .superRefine(checkContent(fileReader(refs), refs), always as never);
}
export type ProcedureDocument = z.input<ReturnType<typeof procedureDocumentSchema>>;

export interface ImportedProcedure {
  procedure: { name: string; purpose: string; testArticle: string; site: string; stations: string[] };
  /** Steps in API form (tSeconds, hazardIds); keys kept where the file had them. */
  phases: PhaseParsed[];
}

const TOP_ORDER = ['format', 'version', 'exportedAt', 'procedure', 'revision', 'stations', 'phases'];

function comparePaths(a: readonly PropertyKey[], b: readonly PropertyKey[]): number {
  for (let i = 0; i < Math.min(a.length, b.length); i++) {
    const x = a[i];
    const y = b[i];
    if (x === y) continue;
    if (typeof x === 'number' && typeof y === 'number') return x - y;
    if (i === 0) return TOP_ORDER.indexOf(String(x)) - TOP_ORDER.indexOf(String(y));
    return 0; // two fields of one step: keep the order the checks found them in
  }
  return a.length - b.length;
}

/** Reads an exchange file against the team's stations and hazards: the procedure, or every problem in it. */
export function readProcedureDocument(raw: unknown, refs: FileReferences): { ok: true; value: ImportedProcedure } | { ok: false; problems: Problem[] } {
  const result = procedureDocumentSchema(refs).safeParse(raw);
  if (!result.success) {
    // In document order, so a list of problems reads from the top of the file down.
    const issues = [...result.error.issues].sort((a, b) => comparePaths(a.path, b.path));
    return { ok: false, problems: issues.map((i) => ({ path: i.path.map(String).join('.') || '(file)', message: i.message })) };
  }
  const reader = fileReader(refs);
  const phases = result.data.phases.map((ph) => ({
    ...(ph.key !== undefined ? { key: ph.key } : {}),
    name: ph.name,
    steps: ph.steps.map((st) => {
      const step = reader.toStep(st, () => {});
      const { key, ...rest } = step;
      return (key === '' ? rest : step) as PhaseParsed['steps'][number];
    }),
  }));
  return { ok: true, value: { procedure: result.data.procedure, phases } };
}

/** Everything an export needs that the revision does not hold itself. */
export interface ExportContext {
  procedure: { name: string; purpose: string; testArticle: string; site: string; stations: string[] };
  revision: { number: number; status: RevisionStatus; releasedAt: string | null; signoffs: { role: string; name: string; at: string }[] };
  stations: { code: string; name: string; callSign: string; defaultPpe: string[] }[];
  hazardCodeById: ReadonlyMap<number, string>;
  exportedAt: string;
}

type FileStep = Omit<Step, 'tSeconds' | 'hazardIds'> & { t: string | null; hazards: string[] };

/** Writes a revision as an exchange file (version 1). */
export function toProcedureDocument(phases: readonly Phase[], c: ExportContext) {
  const used = new Set<string>(c.procedure.stations);
  for (const ph of phases) for (const st of ph.steps) {
    used.add(st.station);
    if (st.kind === 'poll') st.stations.forEach((s) => used.add(s));
  }
  return {
    format: PROCEDURE_FORMAT,
    version: PROCEDURE_FORMAT_VERSION,
    exportedAt: c.exportedAt,
    procedure: { ...c.procedure, stations: [...c.procedure.stations] },
    revision: { ...c.revision },
    stations: c.stations.filter((s) => used.has(s.code)),
    phases: phases.map((ph) => ({
      key: ph.key,
      name: ph.name,
      steps: ph.steps.map((st): FileStep => {
        const { tSeconds, hazardIds, ...rest } = st;
        return {
          ...rest,
          t: tSeconds === null ? null : formatTMinus(tSeconds),
          hazards: hazardIds.map((id) => c.hazardCodeById.get(id)).filter((code): code is string => code !== undefined),
        } as FileStep;
      }),
    })),
  };
}

export type { PropellantId, ResolvedCaution };
