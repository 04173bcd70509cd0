/**
 * Hazard register contract: request schemas the server validates with and
 * response types the client reads. Built on the pure domain so the lists of
 * kinds, statuses and levels exist once.
 */
import { z } from 'zod';
import { HAZARD_STATUSES, MITIGATION_KINDS } from '../domain/hazards/mitigation';
import { LEVEL_GLYPHS } from '../domain/hazards/matrix';
import { PROPELLANT_IDS } from '../domain/propellants/library';
import { ROLES } from '../domain/people/roles';
import { roleSchema } from './people';
import type { UploadDto } from './uploads';

// ---------------------------------------------------------------- vocabularies

export const HAZARD_SYSTEMS = ['engine', 'feed-system', 'pressurant', 'igniter', 'ground-support', 'test-site', 'other'] as const;
export type HazardSystem = (typeof HAZARD_SYSTEMS)[number];

export const HAZARD_PHASES = [
  'transport',
  'assembly',
  'leak-check',
  'propellant-loading',
  'firing',
  'safing',
  'detanking',
] as const;
export type HazardPhase = (typeof HAZARD_PHASES)[number];

export const VERIFICATION_STATUSES = ['planned', 'in-progress', 'verified', 'failed'] as const;
export type VerificationStatus = (typeof VERIFICATION_STATUSES)[number];

export const EVIDENCE_KINDS = ['calc', 'file'] as const;
export type EvidenceKind = (typeof EVIDENCE_KINDS)[number];

/** Calculators that can be frozen as mitigation evidence (same names as /api/calc/<name>). */
export const CALC_NAMES = ['risk', 'propellant-mass', 'quantity-distance', 'surge', 'oxygen'] as const;
export type CalcName = (typeof CALC_NAMES)[number];

/** The built-in matrix id; team matrices use their own slug. */
export const BUILT_IN_MATRIX_ID = 'mil-std-882e';

export const hazardSystemSchema = z.enum(HAZARD_SYSTEMS);
export const hazardPhaseSchema = z.enum(HAZARD_PHASES);
export const hazardStatusSchema = z.enum(HAZARD_STATUSES);
export const mitigationKindSchema = z.enum(MITIGATION_KINDS);
export const verificationStatusSchema = z.enum(VERIFICATION_STATUSES);
export const propellantIdSchema = z.enum(PROPELLANT_IDS);

// ---------------------------------------------------------------- small pieces

const text = (max: number, what: string) =>
  z.string().trim().min(1, `Enter ${what}`).max(max, `Use at most ${max} characters`);
const optionalText = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const textList = (maxItems: number, maxLen: number, what: string) =>
  z.array(text(maxLen, what)).max(maxItems, `List at most ${maxItems}`);

/** A matrix axis key. The built-in matrix uses severities 1..4 (numbers accepted) and likelihoods A..F. */
export const axisKeySchema = z
  .union([z.number().int().min(0).max(999), z.string().trim().min(1).max(20)])
  .transform((v) => String(v));
/** On the wire a severity of the built-in matrix is a number 1..4; a team matrix key is a string. */
export type SeverityValue = number | string;

export const matrixIdSchema = z
  .string()
  .trim()
  .regex(/^[a-z0-9][a-z0-9-]{1,62}$/, 'Use lower-case letters, digits and dashes (2 to 63 characters)');

/** A path id such as /api/hazards/12. */
export const idParamSchema = z.strictObject({ id: z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number) });
export const mitigationParamSchema = z.strictObject({
  id: z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number),
  mid: z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number),
});
export const evidenceParamSchema = z.strictObject({
  id: z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number),
  evidenceId: z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number),
});

// ---------------------------------------------------------------- hazards

const hazardFields = {
  title: text(200, 'a title'),
  system: hazardSystemSchema,
  phase: hazardPhaseSchema,
  description: optionalText(4000),
  causes: textList(20, 500, 'a cause'),
  effects: textList(20, 500, 'an effect'),
  propellants: z.array(propellantIdSchema).max(PROPELLANT_IDS.length),
  energies: textList(20, 200, 'an energy source'),
  matrixId: matrixIdSchema,
  initialSeverity: axisKeySchema,
  initialLikelihood: axisKeySchema,
  /** null clears the residual assessment. */
  residualSeverity: axisKeySchema.nullable(),
  residualLikelihood: axisKeySchema.nullable(),
};

export const hazardCreateInputSchema = z.strictObject({
  title: hazardFields.title,
  system: hazardFields.system,
  phase: hazardFields.phase,
  description: hazardFields.description.default(''),
  causes: hazardFields.causes.default([]),
  effects: hazardFields.effects.default([]),
  propellants: hazardFields.propellants.default([]),
  energies: hazardFields.energies.default([]),
  /** Omitted: the team's default matrix (the built-in one unless the team chose another). */
  matrixId: hazardFields.matrixId.optional(),
  initialSeverity: hazardFields.initialSeverity,
  initialLikelihood: hazardFields.initialLikelihood,
  residualSeverity: hazardFields.residualSeverity.optional(),
  residualLikelihood: hazardFields.residualLikelihood.optional(),
});
export type HazardCreateInput = z.input<typeof hazardCreateInputSchema>;
export type HazardCreateInputParsed = z.output<typeof hazardCreateInputSchema>;

/** Status is not patchable: use POST /api/hazards/:id/status. */
export const hazardUpdateInputSchema = z
  .strictObject({
    title: hazardFields.title.optional(),
    system: hazardFields.system.optional(),
    phase: hazardFields.phase.optional(),
    description: hazardFields.description.optional(),
    causes: hazardFields.causes.optional(),
    effects: hazardFields.effects.optional(),
    propellants: hazardFields.propellants.optional(),
    energies: hazardFields.energies.optional(),
    matrixId: hazardFields.matrixId.optional(),
    initialSeverity: hazardFields.initialSeverity.optional(),
    initialLikelihood: hazardFields.initialLikelihood.optional(),
    residualSeverity: hazardFields.residualSeverity.optional(),
    residualLikelihood: hazardFields.residualLikelihood.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field to change');
export type HazardUpdateInput = z.input<typeof hazardUpdateInputSchema>;

export const hazardListQuerySchema = z.strictObject({
  status: hazardStatusSchema.optional(),
  system: hazardSystemSchema.optional(),
  phase: hazardPhaseSchema.optional(),
  propellant: propellantIdSchema.optional(),
  /** Matches the current risk: residual when assessed, otherwise initial. */
  risk: z.string().trim().min(1).max(40).optional(),
  /** Searched in code, title, description, causes and effects. */
  q: z.string().trim().max(200).optional(),
});
export type HazardListQuery = z.input<typeof hazardListQuerySchema>;

export const statusChangeInputSchema = z.strictObject({
  to: hazardStatusSchema,
  note: optionalText(1000).optional(),
});
export type StatusChangeInput = z.input<typeof statusChangeInputSchema>;

export const acceptanceInputSchema = z.strictObject({ as: roleSchema });
export type AcceptanceInput = z.input<typeof acceptanceInputSchema>;

// ---------------------------------------------------------------- mitigations

export const mitigationInputSchema = z.strictObject({
  kind: mitigationKindSchema,
  description: text(2000, 'a description'),
  /** The person who owns the action, by name. */
  owner: text(120, 'an owner'),
  verificationMethod: optionalText(1000).default(''),
  verificationStatus: verificationStatusSchema.default('planned'),
});
export type MitigationInput = z.input<typeof mitigationInputSchema>;

export const mitigationUpdateInputSchema = z
  .strictObject({
    kind: mitigationKindSchema.optional(),
    description: text(2000, 'a description').optional(),
    owner: text(120, 'an owner').optional(),
    verificationMethod: optionalText(1000).optional(),
    verificationStatus: verificationStatusSchema.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Send at least one field to change');
export type MitigationUpdateInput = z.input<typeof mitigationUpdateInputSchema>;

// ---------------------------------------------------------------- calculators

/** A number from a query string ("2.5") or a JSON body (2.5); ranges are the domain's job. */
const num = z.union([
  z.number(),
  z
    .string()
    .trim()
    .regex(/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/, 'Enter a number')
    .transform(Number),
]);

export const riskCalcQuerySchema = z.strictObject({
  matrix: matrixIdSchema.default(BUILT_IN_MATRIX_ID),
  severity: axisKeySchema,
  likelihood: axisKeySchema,
});
export const propellantMassQuerySchema = z.strictObject({
  propellant: z.string().trim().min(1).max(40),
  volumeL: num,
  fillPercent: num,
  ethanolMassPercent: num.optional(),
});
export const quantityDistanceQuerySchema = z.strictObject({
  propellantKg: num,
  combination: z.string().trim().min(1).max(40).optional(),
  setting: z.string().trim().min(1).max(40).optional(),
  tntPercent: num.optional(),
});
export const surgeQuerySchema = z.strictObject({
  fluid: z.string().trim().min(1).max(40).optional(),
  densityKgM3: num.optional(),
  waveSpeedMps: num.optional(),
  velocityChangeMps: num,
  pipeLengthM: num.optional(),
  innerDiameterM: num.optional(),
  wallThicknessM: num.optional(),
  pipeModulusPa: num.optional(),
  bulkModulusPa: num.optional(),
  valveTimeS: num.optional(),
});
export const oxygenQuerySchema = z.strictObject({ percent: num });

export interface RiskCalcResult {
  matrixId: string;
  level: string;
  label: string;
  rank: number;
  colour: string;
}
export interface PropellantMassCalcResult {
  massKg: number;
  densityKgM3: number;
  source: string;
  basis: string;
  cautions: string[];
}
export interface QuantityDistanceCalcResult {
  tntKg: number;
  tntPercentUsed: number;
  distancesM: { inhabitedBuilding: number; publicTrafficRoute: number; intralineUnbarricaded: number; intralineBarricaded: number };
  sources: string[];
  cautions: string[];
}
export interface SurgeCalcResult {
  deltaPressurePa: number;
  waveSpeedMps: number;
  regime: 'instantaneous' | 'gradual';
  criticalTimeS?: number;
  sources: string[];
  cautions: string[];
}
export interface OxygenCalcResult {
  classification: 'deficient' | 'normal' | 'enriched';
  nfpa53Enriched: boolean;
  sources: string[];
  cautions: string[];
}

/** POST /api/hazards/:id/evidence: the server runs the calculator and freezes inputs and outputs. */
export const evidenceInputSchema = z.discriminatedUnion('calc', [
  z.strictObject({ mitigationId: z.number().int().positive(), label: optionalText(200).optional(), calc: z.literal('risk'), inputs: riskCalcQuerySchema }),
  z.strictObject({ mitigationId: z.number().int().positive(), label: optionalText(200).optional(), calc: z.literal('propellant-mass'), inputs: propellantMassQuerySchema }),
  z.strictObject({ mitigationId: z.number().int().positive(), label: optionalText(200).optional(), calc: z.literal('quantity-distance'), inputs: quantityDistanceQuerySchema }),
  z.strictObject({ mitigationId: z.number().int().positive(), label: optionalText(200).optional(), calc: z.literal('surge'), inputs: surgeQuerySchema }),
  z.strictObject({ mitigationId: z.number().int().positive(), label: optionalText(200).optional(), calc: z.literal('oxygen'), inputs: oxygenQuerySchema }),
]);
export type EvidenceInput = z.input<typeof evidenceInputSchema>;

/**
 * POST /api/hazards/:id/mitigations/:mid/evidence/files is multipart/form-data: the file in the field
 * `file`, and these text fields beside it.
 */
export const fileEvidenceInputSchema = z.strictObject({ label: optionalText(200).optional() });
export type FileEvidenceInput = z.input<typeof fileEvidenceInputSchema>;

/** Frozen calc evidence: what was asked, what came back, and when. */
export interface CalcEvidenceData {
  calc: CalcName;
  inputs: Record<string, unknown>;
  outputs: Record<string, unknown>;
  computedAt: string;
}

// ---------------------------------------------------------------- response DTOs

export interface EvidenceDto {
  id: number;
  kind: EvidenceKind;
  label: string;
  /** For kind 'calc': CalcEvidenceData; empty for kind 'file'. */
  data: CalcEvidenceData | Record<string, unknown>;
  /** For kind 'file': the stored file (GET its url to read it). */
  file: UploadDto | null;
  /** Who attached it, as named at the time; null if unknown. */
  addedBy: string | null;
  createdAt: string;
}

export interface MitigationDto {
  id: number;
  kind: z.infer<typeof mitigationKindSchema>;
  description: string;
  owner: string;
  verificationMethod: string;
  verificationStatus: VerificationStatus;
  evidence: EvidenceDto[];
}

export interface AcceptanceDto {
  userId: number;
  userName: string;
  role: z.infer<typeof roleSchema>;
  at: string;
}

export interface AcceptanceProgressDto {
  /** Roles the residual level needs, each signed by a different person. */
  requiredRoles: z.infer<typeof roleSchema>[];
  missingRoles: z.infer<typeof roleSchema>[];
  complete: boolean;
}

export type RiskLevelKey = 'high' | 'serious' | 'medium' | 'low' | 'eliminated' | (string & {});

export interface HazardDto {
  id: number;
  /** HZ-001, numbered per team. */
  code: string;
  title: string;
  system: HazardSystem;
  phase: HazardPhase;
  description: string;
  causes: string[];
  effects: string[];
  propellants: z.infer<typeof propellantIdSchema>[];
  energies: string[];
  matrixId: string;
  initialSeverity: SeverityValue;
  initialLikelihood: string;
  initialRisk: RiskLevelKey;
  residualSeverity: SeverityValue | null;
  residualLikelihood: string | null;
  residualRisk: RiskLevelKey | null;
  status: z.infer<typeof hazardStatusSchema>;
  mitigations: MitigationDto[];
  acceptances: AcceptanceDto[];
  /** null until a residual risk is assessed. */
  acceptanceProgress: AcceptanceProgressDto | null;
  createdAt: string;
  updatedAt: string;
}

export interface HistoryEntryDto {
  id: number;
  userId: number | null;
  userName: string;
  /** A hazard field, 'status', 'mitigation:<id>.<field>', 'acceptance', 'evidence', or 'cautions'. */
  field: string;
  before: unknown;
  after: unknown;
  at: string;
}

// ---------------------------------------------------------------- risk matrices

/** Keys appear in cell paths ("cells.C.2") and filters, so they stay short and plain. */
const axisKeyText = z
  .string()
  .trim()
  .regex(/^[A-Za-z0-9][A-Za-z0-9-]{0,19}$/, 'Use letters, digits and dashes (up to 20 characters)');
const axisEntrySchema = z.strictObject({
  key: axisKeyText,
  label: text(80, 'a name'),
  description: optionalText(300).optional(),
});
const riskLevelSchema = z.strictObject({
  key: z
    .string()
    .trim()
    .regex(/^[a-z0-9][a-z0-9-]{0,39}$/, 'Use lower-case letters, digits and dashes (up to 40 characters)'),
  label: text(80, 'a label'),
  rank: z.number().int().min(-100).max(100),
  colour: z.string().max(7),
  nightColour: z.string().max(7).optional(),
  glyph: z.enum(LEVEL_GLYPHS).optional(),
});

const riskMatrixFields = {
  name: text(120, 'a name'),
  severities: z.array(axisEntrySchema).min(1, 'Add at least one severity category').max(10, 'Use at most 10 severity categories'),
  likelihoods: z.array(axisEntrySchema).min(1, 'Add at least one likelihood level').max(10, 'Use at most 10 likelihood levels'),
  levels: z.array(riskLevelSchema).min(1, 'Add at least one risk level').max(8, 'Use at most 8 risk levels'),
  cells: z.record(z.string().max(20), z.record(z.string().max(20), z.string().max(40))),
  /**
   * Level key -> roles that must each sign (different people). Omitted: the two worst levels need
   * safety + admin, the rest safety.
   */
  acceptanceMap: z.record(z.string().max(40), z.array(roleSchema).min(1, 'Choose at least one role').max(ROLES.length)).optional(),
};

/**
 * POST /api/risk-matrices. Structural checks here; the server then runs validateMatrix, checkLevelPalette
 * and checkAcceptanceMap and reports what they find as details (the client runs the same checks first).
 */
export const riskMatrixInputSchema = z.strictObject({
  id: matrixIdSchema.refine((id) => id !== BUILT_IN_MATRIX_ID, 'That id is the built-in matrix'),
  ...riskMatrixFields,
});
export type RiskMatrixInput = z.input<typeof riskMatrixInputSchema>;

/** PUT /api/risk-matrices/:id replaces a team matrix no hazard has been assessed with yet. */
export const riskMatrixUpdateInputSchema = z.strictObject(riskMatrixFields);
export type RiskMatrixUpdateInput = z.input<typeof riskMatrixUpdateInputSchema>;

export interface RiskMatrixDto {
  id: string;
  name: string;
  builtIn: boolean;
  severities: { key: string; label: string; description?: string }[];
  likelihoods: { key: string; label: string; description?: string }[];
  levels: { key: string; label: string; rank: number; colour: string; nightColour?: string; glyph?: string }[];
  cells: Record<string, Record<string, string>>;
  acceptanceMap: Record<string, z.infer<typeof roleSchema>[]>;
  createdAt: string | null;
  /** New hazards use the team's default matrix unless another is chosen. */
  isDefault: boolean;
  /** A retired matrix is kept for the hazards assessed with it but offered for no new assessment. */
  retired: boolean;
  retiredAt: string | null;
  /** Hazards of the team assessed with this matrix; while above 0 the matrix cannot change. */
  hazardCount: number;
}

// ---------------------------------------------------------------- propellants

export const cautionSchema = z.strictObject({
  key: z.string().trim().regex(/^[a-z0-9][a-z0-9-]{0,59}$/, 'Use lower-case letters, digits and dashes'),
  severity: z.enum(['warning', 'caution']),
  text: text(2000, 'the caution text'),
  /** Every caution says where it comes from ("common practice, no source" is an honest answer). */
  source: text(300, 'where this comes from'),
});

export const ppeItemSchema = z.strictObject({
  text: text(300, 'the PPE item'),
  source: text(300, 'where this comes from'),
});

/** PATCH /api/propellants/:id/cautions replaces the team's cautions (and PPE, if sent), in the order given. */
export const propellantCautionsInputSchema = z.strictObject({
  cautions: z
    .array(cautionSchema)
    .min(1, 'Keep at least one warning or caution')
    .max(30, 'List at most 30')
    .superRefine((items, ctx) => {
      const seen = new Set<string>();
      items.forEach((c, i) => {
        if (seen.has(c.key)) ctx.addIssue({ code: 'custom', path: [i, 'key'], message: `Two items share the key '${c.key}'` });
        seen.add(c.key);
      });
    }),
  ppe: z.array(ppeItemSchema).max(30, 'List at most 30').optional(),
});
export type PropellantCautionsInput = z.input<typeof propellantCautionsInputSchema>;

export const propellantParamSchema = z.strictObject({ id: propellantIdSchema });

export interface PropellantDto {
  id: z.infer<typeof propellantIdSchema>;
  name: string;
  role: 'oxidiser' | 'fuel' | 'pressurant' | 'inert-cryogen';
  state: 'cryogenic-liquid' | 'liquid' | 'liquefied-gas' | 'compressed-gas';
  properties: { key: string; label: string; value: number | [number, number]; unit: string; source: string; basis: string }[];
  cautions: { key: string; severity: 'warning' | 'caution'; text: string; source: string }[];
  ppe: { text: string; source: string }[];
  /** True when the team's safety officer has edited the library's cautions. */
  cautionsEdited: boolean;
  cautionsEditedBy: string | null;
  cautionsEditedAt: string | null;
}
