import { describe, expect, it } from 'vitest';
import { countCommandPayloadSchema, countCommandSchema, countCreateInputSchema } from '../../src/contract/count';

describe('count command schemas', () => {
  it('accepts each command with its type, and an optional commandId', () => {
    expect(countCommandSchema.parse({ type: 'count:start', commandId: 'c-1' })).toEqual({ type: 'count:start', commandId: 'c-1' });
    expect(countCommandSchema.parse({ type: 'hold:call', category: 'weather', reason: '  Gusts  ', station: 'range' })).toEqual({
      type: 'hold:call',
      category: 'weather',
      reason: 'Gusts',
      station: 'RANGE',
    });
    expect(countCommandSchema.parse({ type: 'reading:record', stepKey: 's3', value: 9.5 }).type).toBe('reading:record');
  });

  it('refuses unknown fields, unknown types, and a hold without a reason', () => {
    expect(countCommandSchema.safeParse({ type: 'count:start', extra: 1 }).success).toBe(false);
    expect(countCommandSchema.safeParse({ type: 'count:launch' }).success).toBe(false);
    const r = countCommandSchema.safeParse({ type: 'hold:call', category: 'weather', reason: '  ' });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues[0]).toMatchObject({ path: ['reason'], message: 'Say why you are calling the hold' });
    expect(countCommandSchema.safeParse({ type: 'count:recycle', toSeconds: -600.5, reason: 'x' }).success).toBe(false);
  });

  it('wraps a command with its count for the socket', () => {
    expect(countCommandPayloadSchema.safeParse({ countId: 3, command: { type: 'count:resume' } }).success).toBe(true);
    expect(countCommandPayloadSchema.safeParse({ countId: 0, command: { type: 'count:resume' } }).success).toBe(false);
  });
});

describe('creating a count', () => {
  it('takes a revision, a name, and optional crew, window and count times', () => {
    const parsed = countCreateInputSchema.parse({
      procedureId: 7,
      revisionId: 21,
      name: 'Kestrel-2 hot fire 3',
      crew: [{ station: 'prop', userIds: [2] }],
      windowEnd: '2025-05-17T14:30:00Z',
      terminalCountSeconds: -60,
      recycleToSeconds: -600,
    });
    expect(parsed.crew).toEqual([{ station: 'PROP', userIds: [2] }]);
  });

  it('refuses a recycle point inside terminal count and a window that is not a date and time', () => {
    const r = countCreateInputSchema.safeParse({ procedureId: 7, revisionId: 21, name: 'x', terminalCountSeconds: -60, recycleToSeconds: -30 });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues[0].path).toEqual(['recycleToSeconds']);
    expect(countCreateInputSchema.safeParse({ procedureId: 7, revisionId: 21, name: 'x', windowEnd: 'tomorrow' }).success).toBe(false);
  });
});
