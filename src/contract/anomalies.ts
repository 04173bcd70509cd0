/**
 * Anomaly reports and lessons learned: what went wrong at an instant of a count (or at a walk-down), what was
 * done at once, which hazards it touches, the corrective actions and the procedure revisions it caused.
 */
import { z } from 'zod';
import { axisKeySchema } from './hazards';
import type { UploadDto } from './uploads';

export const ANOMALY_STATUSES = ['open', 'closed'] as const;
export type AnomalyStatus = (typeof ANOMALY_STATUSES)[number];

export const ACTION_STATUSES = ['open', 'in-progress', 'done'] as const;
export type ActionStatus = (typeof ACTION_STATUSES)[number];
export const ACTION_STATUS_LABELS: Record<ActionStatus, string> = { open: 'Open', 'in-progress': 'In progress', done: 'Done' };

export const anomalyRef = (n: number) => `AN-${String(n).padStart(3, '0')}`;

const text = (max: number, what: string) => z.string().trim().min(1, `Enter ${what}`).max(max, `Use at most ${max} characters`);
const optionalText = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const positiveId = z.number().int('Not a valid id').positive('Not a valid id').max(999_999_999, 'Not a valid id');
const idString = z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number);
/** Epoch milliseconds, as the count log stamps its events. */
const epochMs = z.number().int('Give the instant as whole epoch milliseconds').min(0).max(8_640_000_000_000_000, 'Not a valid instant');
const dateOnly = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the date as YYYY-MM-DD').refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'Not a real date');

export const anomalyParamSchema = z.strictObject({ id: idString });
export const anomalyHazardParamSchema = z.strictObject({ id: idString, hazardId: idString });
export const anomalyActionParamSchema = z.strictObject({ id: idString, actionId: idString });
export const anomalyAttachmentParamSchema = z.strictObject({ id: idString, attachmentId: idString });

export const anomalyCreateInputSchema = z
  .strictObject({
    title: text(200, 'a title'),
    description: text(4000, 'what happened'),
    /** A severity key of the team's default risk matrix (the built-in one: 1..4). */
    severity: axisKeySchema,
    immediateActions: optionalText(4000).default(''),
    /** The count it happened in, or omitted/null for one found outside a count (a walk-down, an inspection). */
    countId: positiveId.nullable().optional(),
    /** The instant: required with a count (any instant of its log); without one, when it was found (default: now). */
    at: epochMs.optional(),
  })
  .superRefine((v, ctx) => {
    if (v.countId != null && v.at === undefined) ctx.addIssue({ code: 'custom', path: ['at'], message: 'Give the instant of the count it happened at' });
  });
export type AnomalyCreateInput = z.input<typeof anomalyCreateInputSchema>;

/** The count and its instant are fixed once reported; the rest can be corrected while the anomaly is open. */
export const anomalyUpdateInputSchema = z
  .strictObject({
    title: text(200, 'a title').optional(),
    description: text(4000, 'what happened').optional(),
    severity: axisKeySchema.optional(),
    immediateActions: optionalText(4000).optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), 'Send at least one field to change');
export type AnomalyUpdateInput = z.input<typeof anomalyUpdateInputSchema>;

export const anomalyListQuerySchema = z.strictObject({
  countId: idString.optional(),
  hazardId: idString.optional(),
  procedureId: idString.optional(),
  status: z.enum(ANOMALY_STATUSES, 'Choose status=open or status=closed').optional(),
});
export type AnomalyListQuery = z.input<typeof anomalyListQuerySchema>;

export const hazardLinkInputSchema = z.strictObject({ hazardId: positiveId });

export const correctiveActionInputSchema = z.strictObject({
  description: text(1000, 'what is to be done'),
  ownerId: positiveId,
  dueDate: dateOnly,
  status: z.enum(ACTION_STATUSES, 'Choose open, in-progress or done').default('open'),
});
export type CorrectiveActionInput = z.input<typeof correctiveActionInputSchema>;

export const correctiveActionUpdateInputSchema = z
  .strictObject({
    description: text(1000, 'what is to be done').optional(),
    ownerId: positiveId.optional(),
    dueDate: dateOnly.optional(),
    status: z.enum(ACTION_STATUSES, 'Choose open, in-progress or done').optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), 'Send at least one field to change');
export type CorrectiveActionUpdateInput = z.input<typeof correctiveActionUpdateInputSchema>;

export const closeInputSchema = z.strictObject({ note: optionalText(1000).default('') });
export const attachmentFieldsSchema = z.strictObject({ caption: optionalText(200).default('') });
export const lessonInputSchema = z.strictObject({ procedureId: positiveId });

// ---------------------------------------------------------------- responses

export interface AnomalyRevisionLinkDto {
  procedureId: number;
  procedureName: string;
  revisionNumber: number;
  revisionStatus: string;
  /** True when this anomaly opened the draft; false when it was linked to a draft already open. */
  drafted: boolean;
  at: string;
}

export interface AnomalySummaryDto {
  id: number;
  ref: string;
  title: string;
  status: AnomalyStatus;
  matrixId: string;
  severity: number | string;
  severityLabel: string;
  countId: number | null;
  countName: string | null;
  /** The instant, ISO and epoch ms. */
  at: string;
  atMs: number;
  /** T at that instant from the count's log (null without a count, or before the count started). */
  tSeconds: number | null;
  tText: string | null;
  /** The count's status at that instant, e.g. holding. */
  countStatus: string | null;
  hazardIds: number[];
  openActions: number;
  revisions: AnomalyRevisionLinkDto[];
  reportedBy: string | null;
  createdAt: string;
}

export interface CorrectiveActionDto {
  id: number;
  description: string;
  ownerId: number | null;
  ownerName: string | null;
  dueDate: string;
  status: ActionStatus;
  createdAt: string;
}

export interface AnomalyAttachmentDto {
  id: number;
  caption: string;
  file: UploadDto;
  addedBy: string | null;
}

export interface AnomalyHistoryDto {
  id: number;
  userName: string;
  at: string;
  /** The change in words. */
  text: string;
}

export interface AnomalyDto extends AnomalySummaryDto {
  description: string;
  immediateActions: string;
  hazards: { id: number; code: string; title: string; status: string }[];
  attachments: AnomalyAttachmentDto[];
  actions: CorrectiveActionDto[];
  history: AnomalyHistoryDto[];
  closedAt: string | null;
  closedBy: string | null;
}

export interface AnomalyPersonDto {
  id: number;
  name: string;
}

export interface LessonDto {
  anomaly: AnomalyDto;
  procedureId: number;
  revisionNumber: number;
  /** False when a draft was already open and was linked instead of a new one. */
  created: boolean;
}
