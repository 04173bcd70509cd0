/**
 * When did the clock read a given T? An auditor asks "what happened at T-4:12"; a count that held or recycled
 * passed that T more than once, or stood at it. `instantsAtT` walks the log once with the reducer and answers every
 * instant (epoch ms) the clock read `tSeconds`: the moment it ran through it, or the first moment it stood on it.
 */
import type { CountEvent } from './events';
import { reduce } from './reduce';
import { initialCountState } from './state';

export function instantsAtT(events: readonly CountEvent[], tSeconds: number): number[] {
  const out: number[] = [];
  let state = initialCountState();
  let standingOnIt = false;
  for (let i = 0; i < events.length; i++) {
    state = reduce(state, events[i]!);
    const from = events[i]!.at;
    // The log ends at its last event: nothing after it is known.
    const to = events[i + 1]?.at ?? from;
    const { clock } = state;
    if (clock.anchorAt === null) continue;
    if (clock.running) {
      const at = clock.anchorAt + (tSeconds - clock.tSeconds) * 1000;
      // Each stretch of running clock is [from, to): an instant on a boundary belongs to the stretch it starts.
      const inStretch = at >= from && (at < to || (i === events.length - 1 && at === from));
      // A clock that stood on T and runs on from it read T once, when it got there.
      const runsOnFromIt = standingOnIt && at === from;
      if (inStretch && !runsOnFromIt) out.push(Math.round(at));
      standingOnIt = false;
    } else {
      const standing = Math.abs(clock.tSeconds - tSeconds) < 0.5;
      if (standing && !standingOnIt) out.push(from);
      standingOnIt = standing;
    }
  }
  return out;
}
