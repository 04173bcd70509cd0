/** The spoken T-minus calls of the watch view: T-10:00, T-5:00, T-1:00, T-30 s, then every second from T-10. */
const NAMED: Record<number, string> = {
  [-600]: 'T minus 10 minutes',
  [-300]: 'T minus 5 minutes',
  [-60]: 'T minus 1 minute',
  [-30]: 'T minus 30 seconds',
};

/**
 * The call to speak when the shown second moves from `prev` to `next` (whole seconds, as displayed), or null.
 * A jump (a recycle, a late join) speaks nothing: only a step of one second while counting is called.
 */
export function callFor(prev: number | null, next: number): string | null {
  if (prev === null || next !== prev + 1) return null;
  if (NAMED[next]) return NAMED[next];
  if (next >= -10 && next <= -1) return String(-next);
  if (next === 0) return 'zero';
  return null;
}
