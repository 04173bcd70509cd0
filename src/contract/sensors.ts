/**
 * Sensor data for a count: CSV files of test-stand readings, stored as compact columns, plotted on the count's
 * timeline. The limits both sides state, the inputs the server validates and the shapes it answers with.
 */
import { z } from 'zod';
import type { ChannelSummary } from '../domain/sensors/summary';
import type { SensorTimeline } from '../domain/sensors/timeline';

/** At most this many channels (columns besides time) in one file. */
export const SENSOR_MAX_CHANNELS = 16;
/** At most this many data rows in one file (about 33 minutes at 100 Hz). */
export const SENSOR_MAX_ROWS = 200_000;
/** The data route answers at most this many points per channel, and at least this few when it decimates. */
export const SENSOR_MAX_POINTS = 20_000;
export const SENSOR_MIN_POINTS = 10;

/** Who may add, edit and remove datasets; everyone signed in may read them. */
export const SENSOR_WRITERS = ['conductor', 'safety', 'admin', 'operator'] as const;

const limitValue = z.number('Enter the limit as a number').finite().nullable();

/** A channel's limit lines, in the channel's unit; either side may be absent. */
export const channelLimitsSchema = z
  .strictObject({ low: limitValue.optional(), high: limitValue.optional() })
  .refine((v) => v.low == null || v.high == null || v.low < v.high, { path: ['high'], message: 'The high limit must be above the low limit' });
export type ChannelLimitsInput = z.input<typeof channelLimitsSchema>;

const unitSchema = z.string().trim().max(20, 'Use at most 20 characters');

/** Sent with an upload, as the JSON text of the form field `limits`: limits by channel name. */
export const uploadLimitsSchema = z.record(z.string().min(1).max(60), channelLimitsSchema);

/** The text fields of the multipart upload; the file itself is the field `file`. */
export const sensorUploadFieldsSchema = z.strictObject({
  limits: z
    .string()
    .max(4000)
    .optional()
    .transform((text, ctx) => {
      if (text === undefined || text.trim() === '') return {};
      let raw: unknown;
      try {
        raw = JSON.parse(text);
      } catch {
        ctx.addIssue({ code: 'custom', message: 'Send the limits as JSON, e.g. {"chamber_pressure": {"high": 25}}' });
        return z.NEVER;
      }
      const parsed = uploadLimitsSchema.safeParse(raw);
      if (!parsed.success) {
        for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message });
        return z.NEVER;
      }
      return parsed.data;
    }),
});

/** PATCH /api/counts/:id/sensors/:datasetId: limits (and a missing unit) per channel, by channel index. */
export const sensorLimitsPatchSchema = z.strictObject({
  channels: z
    .array(
      z.strictObject({
        index: z.number().int().min(0).max(SENSOR_MAX_CHANNELS - 1),
        unit: unitSchema.optional(),
        low: limitValue.optional(),
        high: limitValue.optional(),
      }),
    )
    .min(1, 'Change at least one channel')
    .max(SENSOR_MAX_CHANNELS)
    .superRefine((list, ctx) => {
      list.forEach((c, i) => {
        if (c.low != null && c.high != null && c.low >= c.high) ctx.addIssue({ code: 'custom', path: [i, 'high'], message: 'The high limit must be above the low limit' });
        if (list.findIndex((o) => o.index === c.index) !== i) ctx.addIssue({ code: 'custom', path: [i, 'index'], message: 'This channel is listed twice' });
      });
    }),
});
export type SensorLimitsPatch = z.input<typeof sensorLimitsPatchSchema>;

export const sensorParamsSchema = z.strictObject({
  id: z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number),
  datasetId: z.string().regex(/^[1-9]\d{0,8}$/, 'Not a valid id').transform(Number),
});

const secondsParam = z
  .string()
  .regex(/^-?\d{1,7}(\.\d{1,6})?$/, 'Give seconds from T-0, like -12.5')
  .transform(Number);

export const sensorDataQuerySchema = z.strictObject({
  /** Only the rows from `from` to `to` seconds (and one either side), for a zoomed view. */
  from: secondsParam.optional(),
  to: secondsParam.optional(),
  maxPoints: z
    .string()
    .regex(/^\d{1,9}$/, 'Give a whole number of points')
    .transform(Number)
    .pipe(z.number().min(SENSOR_MIN_POINTS, `At least ${SENSOR_MIN_POINTS} points`).max(SENSOR_MAX_POINTS, `At most ${SENSOR_MAX_POINTS} points`))
    .optional(),
}).refine((q) => q.from === undefined || q.to === undefined || q.from < q.to, { path: ['to'], message: 'The end must be after the start' });

// ---------------------------------------------------------------- answers

/** How the file gave its times: seconds from T-0, or wall-clock timestamps converted with the count's actual T-0. */
export type SensorTimeBase = 'seconds' | 'wallclock';

export interface SensorChannelDto {
  index: number;
  name: string;
  unit: string;
  low: number | null;
  high: number | null;
}

export interface SensorDatasetDto {
  id: number;
  countId: number;
  /** The original file, kept as it was uploaded. */
  file: { uploadId: number; name: string; sizeBytes: number; sha256: string; url: string };
  timeBase: SensorTimeBase;
  /** The header of the time column, as written. */
  timeColumn: string;
  rows: number;
  /** Seconds from T-0 of the first and the last row. */
  tStart: number;
  tEnd: number;
  channels: SensorChannelDto[];
  uploadedBy: { userId: number; name: string } | null;
  uploadedAt: string;
}

export interface SensorListDto {
  countId: number;
  countName: string;
  datasets: SensorDatasetDto[];
  /** The count's own timeline on the plot's axis: T-0, holds and redline readings, from its log. */
  timeline: SensorTimeline;
}

export interface SensorDataDto {
  datasetId: number;
  /** Rows in the stored dataset, and rows in this answer (fewer when decimated). */
  rows: number;
  points: number;
  decimated: boolean;
  /** The view asked for with from/to, or null for the whole dataset. */
  window: { from: number; to: number } | null;
  /** Seconds from T-0. */
  t: number[];
  /** One array per channel, aligned with t; null where a cell was empty. */
  values: (number | null)[][];
  /** Per channel, from every stored row (never from the decimated points). */
  summaries: ChannelSummary[];
}
