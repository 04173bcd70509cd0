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

/** A datetime-local value (with or without seconds) -> epoch ms, or undefined when it is not a time. */
export function parseInstantInput(value: string): number | undefined {
  const text = value.length === 16 ? `${value}:00` : value;
  const d = parse(text, INPUT_FORMAT, new Date(0));
  return isValid(d) ? d.getTime() : undefined;
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

