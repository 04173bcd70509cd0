/**
 * Count times as signed seconds from T-0: T-30:00 is -1800, T+5:00 is 300. Written the way the trade prints
 * them: minutes and seconds under an hour (T-5:00), hours, minutes and seconds from an hour up (T-2:00:00).
 */

/** The longest count Holdfire will hold a time for, either side of T-0: seven days. */
export const MAX_COUNT_SECONDS = 7 * 24 * 3600;

function clock(total: number): string {
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  const ss = String(s).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

/** -1800 -> 'T-30:00', 300 -> 'T+5:00', -7200 -> 'T-2:00:00'; T-0 itself is 'T-0:00'. */
export function formatTMinus(seconds: number): string {
  if (!Number.isInteger(seconds)) throw new RangeError(`A count time is a whole number of seconds, not ${seconds}.`);
  return `T${seconds > 0 ? '+' : '-'}${clock(Math.abs(seconds))}`;
}

/** 300 -> '5:00', 3600 -> '1:00:00': a hold's length or a time left. */
export function formatDuration(seconds: number): string {
  if (!Number.isInteger(seconds) || seconds < 0) throw new RangeError(`A duration is a whole, non-negative number of seconds, not ${seconds}.`);
  return clock(seconds);
}

// T, a sign (ASCII minus, Unicode minus or plus), then m:ss or h:mm:ss; "T-0" alone is also T-0.
const PATTERN = /^T\s*([-+\u2212])\s*(?:(\d{1,3}):([0-5]\d):([0-5]\d)|(\d{1,4}):([0-5]\d)|(0))$/i;

/**
 * 'T-30:00' -> -1800, 'T+5:00' -> 300, 'T-2:00:00' -> -7200, 'T+0:10:00' -> 600. Returns undefined for text
 * that is not a count time, so a form can say so at the field.
 */
export function parseTMinus(text: string): number | undefined {
  const m = PATTERN.exec(text.trim());
  if (!m) return undefined;
  const sign = m[1] === '+' ? 1 : -1;
  let magnitude: number;
  if (m[2] !== undefined) magnitude = Number(m[2]) * 3600 + Number(m[3]) * 60 + Number(m[4]);
  else if (m[5] !== undefined) magnitude = Number(m[5]) * 60 + Number(m[6]);
  else magnitude = 0;
  if (magnitude > MAX_COUNT_SECONDS) return undefined;
  // Avoid -0: T-0 and T+0 are the same instant.
  return magnitude === 0 ? 0 : sign * magnitude;
}

/** The message a form shows when parseTMinus refused the text. */
export const T_MINUS_HINT = 'Write a count time like T-30:00, T+5:00 or T-2:00:00.';
