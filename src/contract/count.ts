/**
 * The live count's contract: the commands a client sends (over the socket, or as a body), the body that
 * creates a count, and the shapes the server answers with. The count's state is the domain reducer's own
 * state, sent as it is, so a client folds further events onto it with the same reducer.
 */
import { z } from 'zod';
import type { CountCommand } from '../domain/count/commands';
import { HOLD_CATEGORIES, type CountEvent } from '../domain/count/events';
import type { CountState, CountStatus } from '../domain/count/state';
import { MAX_COUNT_SECONDS } from '../domain/procedures/tminus';
import { stationCodeSchema, stepKeySchema } from './procedures';

const positiveId = z.number().int().positive().max(999_999_999);
const countTime = z.number().int('Use whole seconds').min(-MAX_COUNT_SECONDS).max(MAX_COUNT_SECONDS);
const reason = (what: string) => z.string().trim().min(1, `Say why ${what}`).max(500, 'Use at most 500 characters');
const holdCategory = z.enum(HOLD_CATEGORIES, 'Choose a category: weather, hardware, propellant, range, personnel, data or other');
/** Sent again with a retried command, so the server can answer the first result instead of acting twice. */
const commandId = z.string().min(1).max(64).optional();

// ---------------------------------------------------------------- commands

export const countCommandSchema = z.discriminatedUnion('type', [
  z.strictObject({
    type: z.literal('count:start'),
    commandId,
    /** Pick the count up later than the plan's start (a rehearsal of the last minutes); earlier steps are skipped. */
    fromSeconds: z.number().int('Whole seconds').max(-1, 'Pick the count up before T-0').min(-30 * 24 * 3600).optional(),
  }),
  z.strictObject({
    type: z.literal('poll:open'),
    commandId,
    question: z.string().trim().max(300, 'Use at most 300 characters').optional(),
    stations: z.array(stationCodeSchema).min(1, 'Name at least one station').max(30).optional(),
    stepKey: stepKeySchema.nullable().optional(),
    timeoutSeconds: z.number().int().min(5, 'At least 5 seconds').max(3600, 'At most an hour').optional(),
  }),
  z.strictObject({
    type: z.literal('poll:answer'),
    commandId,
    pollId: z.string().min(1).max(20),
    station: stationCodeSchema,
    answer: z.enum(['go', 'nogo']),
    /** Required with a no-go; the domain says so with the station's name. */
    reason: z.string().trim().max(500, 'Use at most 500 characters').optional(),
  }),
  z.strictObject({
    type: z.literal('hold:call'),
    commandId,
    category: holdCategory,
    reason: reason('you are calling the hold'),
    station: stationCodeSchema.optional(),
  }),
  z.strictObject({ type: z.literal('hold:clear'), commandId, holdId: z.string().min(1).max(20) }),
  z.strictObject({ type: z.literal('count:resume'), commandId }),
  z.strictObject({ type: z.literal('count:recycle'), commandId, toSeconds: countTime.optional(), reason: reason('the count recycles') }),
  z.strictObject({ type: z.literal('count:scrub'), commandId, category: holdCategory, reason: reason('the count is scrubbed') }),
  z.strictObject({ type: z.literal('step:complete'), commandId, stepKey: stepKeySchema }),
  z.strictObject({ type: z.literal('reading:record'), commandId, stepKey: stepKeySchema, value: z.number('Enter the reading as a number') }),
  z.strictObject({ type: z.literal('builtInHold:release'), commandId }),
  z.strictObject({ type: z.literal('count:complete'), commandId }),
  z.strictObject({ type: z.literal('count:close-safing'), commandId }),
]);
export type CountCommandInput = z.input<typeof countCommandSchema>;
export type CountCommandParsed = z.output<typeof countCommandSchema>;

// Every parsed command is a command the domain decides on.
const _commandFits = (c: CountCommandParsed): CountCommand => c;
void _commandFits;

// ---------------------------------------------------------------- creating a count (POST /api/counts)

export const countCreateInputSchema = z
  .strictObject({
    procedureId: positiveId,
    revisionId: positiveId,
    name: z.string().trim().min(1, 'Enter a name').max(160, 'Use at most 160 characters'),
    /** Defaults to the crew plan the server finds for the procedure, or an empty crew. */
    crew: z
      .array(z.strictObject({ station: stationCodeSchema, userIds: z.array(positiveId).min(1, 'Put someone on the station').max(20) }))
      .max(30, 'List at most 30 stations')
      .optional(),
    windowEnd: z.iso.datetime({ offset: true, message: 'Use a date and time like 2025-05-17T14:30:00Z' }).optional(),
    /** When the crew is asked to report; sent to each of them with their station. */
    reportAt: z.iso.datetime({ offset: true, message: 'Use a date and time like 2025-05-17T06:30:00Z' }).optional(),
    terminalCountSeconds: countTime.max(0, 'Terminal count starts before T-0').optional(),
    recycleToSeconds: countTime.max(0, 'Recycle to a time before T-0').optional(),
    /** Phases run after a scrub or after firing; default: those named for safing. */
    safingPhaseKeys: z.array(stepKeySchema).max(20).optional(),
    pollTimeoutSeconds: z.number().int().min(5, 'At least 5 seconds').max(3600, 'At most an hour').optional(),
  })
  .refine((v) => v.terminalCountSeconds === undefined || v.recycleToSeconds === undefined || v.recycleToSeconds < v.terminalCountSeconds, {
    path: ['recycleToSeconds'],
    message: 'Recycle to a time before terminal count starts',
  });
export type CountCreateInput = z.input<typeof countCreateInputSchema>;

// ---------------------------------------------------------------- socket payloads

export const countJoinSchema = z.strictObject({ countId: positiveId, sinceSeq: z.number().int().min(0).default(0) });
export const countLeaveSchema = z.strictObject({ countId: positiveId });
export const countCommandPayloadSchema = z.strictObject({ countId: positiveId, command: countCommandSchema });

// ---------------------------------------------------------------- answers

export interface CountSummaryDto {
  id: number;
  name: string;
  procedureId: number;
  procedureName: string;
  revisionNumber: number;
  status: CountStatus;
  createdBy: { userId: number; name: string };
  createdAt: string;
  startedAt: string | null;
  t0At: string | null;
  closedAt: string | null;
  windowEnd: string | null;
  /** When the crew is asked to report. */
  reportAt: string | null;
}

/** The reducer's state as it is: plain JSON. */
export type CountStateDto = CountState;

/** A stored event: the domain event plus its count and its link in the tamper-evident hash chain. */
export type CountEventDto = CountEvent & { countId: number; prevHash: string; hash: string };

export interface CountDetailDto extends CountSummaryDto {
  state: CountStateDto;
}

export type { CountCommand };
