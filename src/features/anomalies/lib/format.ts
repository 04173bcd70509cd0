import { format, isValid, parse } from 'date-fns';
import type { BadgeTone } from '../../../components/ui/Badge';
import type { GlyphShape } from '../../../components/ui/Glyph';
import type { ActionStatus, AnomalyStatus } from '../../../contract/anomalies';
import type { Role } from '../../../domain/people/roles';

const INPUT_FORMAT = "yyyy-MM-dd'T'HH:mm:ss";

/** Epoch ms -> the value of a datetime-local input with seconds, in the browser's time zone. */
export function instantInputValue(ms: number): string {
  return format(ms, INPUT_FORMAT);
}

/**
 * A datetime-local value -> epoch ms, or undefined when it is not a time. Browsers give minutes, seconds or
 * milliseconds (2031-05-17T14:03, …T14:03:22, …T14:03:22.250) depending on the step and the value.
 */
export function parseInstantInput(value: string): number | undefined {
  const m = /^(\d{4}-\d{2}-\d{2}T\d{2}:\d{2})(:\d{2})?(?:\.(\d{1,3}))?$/.exec(value);
  if (!m) return undefined;
  const d = parse(`${m[1]}${m[2] ?? ':00'}`, INPUT_FORMAT, new Date(0));
  return isValid(d) ? d.getTime() + (m[3] ? Number(m[3].padEnd(3, '0')) : 0) : undefined;
}

/** Wall time with seconds, 24-hour, local: 2031-05-17 14:03:22. */
export function wallTime(ms: number): string {
  return format(ms, 'yyyy-MM-dd HH:mm:ss');
}

export const STATUS_LOOK: Record<AnomalyStatus, { word: string; tone: BadgeTone; glyph: GlyphShape }> = {
  open: { word: 'Open', tone: 'caution', glyph: 'triangle' },
  closed: { word: 'Closed', tone: 'go', glyph: 'check' },
};

export const ACTION_LOOK: Record<ActionStatus, { word: string; tone: BadgeTone; glyph: GlyphShape }> = {
  open: { word: 'Open', tone: 'caution', glyph: 'triangle' },
  'in-progress': { word: 'In progress', tone: 'neutral', glyph: 'clock' },
  done: { word: 'Done', tone: 'go', glyph: 'check' },
};

/** Who may report anomalies and work on them (the server checks the same). */
export const canReport = (roles: readonly Role[]) => roles.some((r) => r === 'conductor' || r === 'safety' || r === 'admin' || r === 'operator');
export const canClose = (roles: readonly Role[]) => roles.includes('safety');
export const canAddHazards = (roles: readonly Role[]) => roles.includes('safety') || roles.includes('admin');
export const canDraftProcedures = (roles: readonly Role[]) => roles.some((r) => r === 'conductor' || r === 'safety' || r === 'admin');

