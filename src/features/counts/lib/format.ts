import { format } from 'date-fns';
import type { GlyphShape } from '../../../components/ui/Glyph';
import type { BadgeTone } from '../../../components/ui/Badge';
import { HOLD_CATEGORY_LABELS, type CountEvent, type CountPlan } from '../../../domain/count/events';
import { countedSteps, reachTimes, stepLabel } from '../../../domain/count/plan';
import { formatTMinus } from '../../../domain/procedures/tminus';
import type { CountStatus } from '../../../domain/count/state';

function pad(n: number): string {
  return String(n).padStart(2, '0');
}

/**
 * The big clock: T-01:23:45 before T-0, T+00:00:05 after. Whole seconds by floor, so T-00:00:01 shows until T
 * reaches zero.
 */
export function formatCountClock(t: number): string {
  const s = Math.floor(t);
  const abs = Math.abs(s);
  return `T${s > 0 ? '+' : '-'}${pad(Math.floor(abs / 3600))}:${pad(Math.floor((abs % 3600) / 60))}:${pad(abs % 60)}`;
}

/** Wall-clock time of day for the log and the projection, local, 24-hour. */
export function clockTime(ms: number): string {
  return format(ms, 'HH:mm:ss');
}

export const STATUS_LOOK: Record<CountStatus, { word: string; tone: BadgeTone; glyph: GlyphShape; meaning: string }> = {
  ready: { word: 'Ready', tone: 'neutral', glyph: 'square', meaning: 'not started' },
  counting: { word: 'Counting', tone: 'go', glyph: 'circle', meaning: 'the clock is running' },
  holding: { word: 'Holding', tone: 'danger', glyph: 'diamond', meaning: 'the clock stands still' },
  safing: { word: 'Safing', tone: 'caution', glyph: 'triangle', meaning: 'making the stand safe' },
  scrubbed: { word: 'Scrubbed', tone: 'danger', glyph: 'cross', meaning: 'no firing today' },
  complete: { word: 'Complete', tone: 'neutral', glyph: 'check', meaning: 'the count is closed' },
};

/** 95 -> '1 min 35 s', 3700 -> '1 h 1 min'. */
export function spanWords(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min${s % 60 ? ` ${s % 60} s` : ''}`;
  return `${Math.floor(s / 3600)} h${Math.floor((s % 3600) / 60) ? ` ${Math.floor((s % 3600) / 60)} min` : ''}`;
}

function stepOf(plan: CountPlan | null, key: string) {
  const step = plan?.steps.find((s) => s.key === key);
  return step ? { station: step.station, label: stepLabel(step) } : { station: '', label: key };
}

function who(e: CountEvent): string {
  if (e.station && e.actor) return `${e.station} (${e.actor.name})`;
  return e.station ?? e.actor?.name ?? 'The count';
}

/** One log line's words, without its times: 'PROP answered NO-GO: vent valve slow'. */
export function eventWords(e: CountEvent, plan: CountPlan | null): string {
  switch (e.type) {
    case 'count:created':
      return `Count created from revision ${e.payload.revisionNumber} by ${e.actor?.name ?? 'the server'}`;
    case 'count:started': {
      const from = e.payload.fromSeconds;
      const by = `by ${e.actor?.name ?? 'the conductor'}`;
      if (from === undefined) return `Count started ${by}`;
      const skipped = plan ? countedSteps(plan).filter((s) => (reachTimes(plan).get(s.key) ?? 0) < from).length : 0;
      return `Count picked up at ${formatTMinus(from)} ${by}; ${skipped} earlier step${skipped === 1 ? '' : 's'} skipped`;
    }
    case 'step:reached': {
      const s = stepOf(plan, e.payload.stepKey);
      return `${s.station} step due: ${s.label}`;
    }
    case 'step:completed': {
      const s = stepOf(plan, e.payload.stepKey);
      return `${s.station} done: ${s.label}${e.actor ? ` (${e.actor.name})` : ''}`;
    }
    case 'reading:recorded': {
      const s = stepOf(plan, e.payload.stepKey);
      return `${s.station} read ${e.payload.message}${e.payload.inLimits ? '' : ' — OUT OF LIMITS'}: ${s.label}`;
    }
    case 'poll:opened':
      return `Poll ${e.payload.pollId} opened for ${e.payload.stations.join(', ')}: ${e.payload.question}`;
    case 'poll:answered':
      return `${e.payload.station} answered ${e.payload.answer === 'go' ? 'GO' : `NO-GO: ${e.payload.reason}`}`;
    case 'poll:closed': {
      const { result, nogo, missing, lost } = e.payload;
      if (result === 'go') return `Poll ${e.payload.pollId} closed: all GO`;
      const parts = [
        ...nogo.map((n) => `${n.station} no-go (${n.reason})`),
        ...(missing.length ? [`no answer from ${missing.join(', ')}`] : []),
        ...(lost.length ? [`lost: ${lost.join(', ')}`] : []),
      ];
      return `Poll ${e.payload.pollId} closed: NO-GO — ${parts.join('; ')}`;
    }
    case 'hold:called':
      return `HOLD ${e.payload.holdId} called by ${e.payload.source === 'person' ? who(e) : e.payload.source === 'redline' ? `a redline at ${e.payload.calledByStation ?? 'a station'}` : e.payload.source === 'poll' ? 'a failed poll' : 'the server'} — ${HOLD_CATEGORY_LABELS[e.payload.category]}: ${e.payload.reason}`;
    case 'hold:cleared':
      return `Hold ${e.payload.holdId} cleared by ${who(e)}`;
    case 'builtInHold:started':
      return `Built-in hold started (${spanWords(e.payload.durationSeconds)}): ${stepOf(plan, e.payload.stepKey).label}`;
    case 'builtInHold:ended':
      return e.payload.early ? `Built-in hold released early by ${e.actor?.name ?? 'the conductor'}` : 'Built-in hold ended';
    case 'count:resumed':
      return `Count resumed by ${e.actor?.name ?? 'the conductor'}`;
    case 'count:recycled':
      return `Recycled to ${formatCountClock(e.payload.toSeconds)} by ${e.actor?.name ?? 'the conductor'}: ${e.payload.reason}`;
    case 'count:scrubbed':
      return `SCRUBBED by ${e.actor?.name ?? 'the conductor'} — ${HOLD_CATEGORY_LABELS[e.payload.category]}: ${e.payload.reason}`;
    case 'count:completed':
      return `Firing declared complete by ${e.actor?.name ?? 'the conductor'}`;
    case 'count:safed':
      return `Safing closed by ${e.actor?.name ?? 'the conductor'}`;
    case 'station:connected':
      return `${e.payload.station} connected`;
    case 'station:lost':
      return `${e.payload.station} lost (no connection)`;
    case 't0:reached':
      return 'T-0 reached';
  }
}
