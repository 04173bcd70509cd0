import { describe, expect, it } from 'vitest';
import { formatDuration, formatTMinus, MAX_COUNT_SECONDS, parseTMinus } from '../../src/domain/procedures/tminus';

// Notation: T-minus/T-plus as minutes:seconds, hours:minutes:seconds from an hour up (common practice, no source).
// The values are arithmetic: 30 min = 1800 s, 2 h = 7200 s.
describe('formatTMinus', () => {
  it.each([
    [-1800, 'T-30:00'],
    [300, 'T+5:00'],
    [-7200, 'T-2:00:00'],
    [600, 'T+10:00'],
    [-5, 'T-0:05'],
    [-3599, 'T-59:59'],
    [-3600, 'T-1:00:00'],
    [-3661, 'T-1:01:01'],
    [0, 'T-0:00'],
  ])('%i s is %s', (seconds, text) => expect(formatTMinus(seconds)).toBe(text));

  it('refuses fractions of a second', () => expect(() => formatTMinus(1.5)).toThrow(RangeError));
});

describe('parseTMinus', () => {
  it.each([
    ['T-30:00', -1800],
    ['T+5:00', 300],
    ['T-2:00:00', -7200],
    ['T+0:10:00', 600],
    ['t-0:05', -5],
    ['T \u2212 10:00', -600],
    ['T-90:00', -5400],
    ['T-0', 0],
    ['T+0:00', 0],
  ])('%s is %i s', (text, seconds) => expect(parseTMinus(text)).toBe(seconds));

  it.each(['', '30:00', 'T30:00', 'T-30', 'T-5:60', 'T-1:60:00', 'T-1:5:00', 'T-1.5:00', 'T--5:00', 'minus five'])(
    'refuses %j',
    (text) => expect(parseTMinus(text)).toBeUndefined(),
  );

  it('refuses a time beyond seven days', () => {
    expect(parseTMinus('T-168:00:00')).toBe(-MAX_COUNT_SECONDS);
    expect(parseTMinus('T-168:00:01')).toBeUndefined();
  });

  it('round-trips every minute of a two-hour count', () => {
    for (let t = -7200; t <= 600; t += 60) expect(parseTMinus(formatTMinus(t))).toBe(t);
  });
});

describe('formatDuration', () => {
  it('writes hold lengths', () => {
    expect(formatDuration(300)).toBe('5:00');
    expect(formatDuration(600)).toBe('10:00');
    expect(formatDuration(3600)).toBe('1:00:00');
    expect(() => formatDuration(-1)).toThrow(RangeError);
  });
});
