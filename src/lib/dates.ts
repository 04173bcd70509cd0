import { format, formatDistanceToNowStrict, isValid, parseISO } from 'date-fns';

function toDate(value: string | Date): Date | null {
  const date = typeof value === 'string' ? parseISO(value) : value;
  return isValid(date) ? date : null;
}

/** "3 Jun 2025, 14:05" in the viewer's local time; 24-hour because test logs are read that way. */
export function formatDateTime(value: string | Date): string {
  const date = toDate(value);
  return date ? format(date, 'd MMM yyyy, HH:mm') : 'unknown time';
}

/** Same with seconds, for mail and log lines where the order within a minute matters. */
export function formatDateTimeSeconds(value: string | Date): string {
  const date = toDate(value);
  return date ? format(date, 'd MMM yyyy, HH:mm:ss') : 'unknown time';
}

/** "in 6 days" / "5 minutes ago". */
export function formatRelative(value: string | Date, now: Date = new Date()): string {
  const date = toDate(value);
  if (!date) return '';
  const distance = formatDistanceToNowStrict(date, { roundingMethod: 'floor' });
  return date.getTime() >= now.getTime() ? `in ${distance}` : `${distance} ago`;
}

export function isPast(value: string | Date, now: Date = new Date()): boolean {
  const date = toDate(value);
  return date ? date.getTime() < now.getTime() : false;
}
