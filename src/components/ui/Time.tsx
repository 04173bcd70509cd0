import { formatDateTime, formatDateTimeSeconds, formatRelative } from '../../lib/dates';

/** A machine-readable <time> with a readable local date and, optionally, how long ago or until. */
export function Time({ value, relative = false, seconds = false }: { value: string; relative?: boolean; seconds?: boolean }) {
  const text = seconds ? formatDateTimeSeconds(value) : formatDateTime(value);
  return (
    <time dateTime={value}>
      {text}
      {relative ? <span className="text-ink-muted"> ({formatRelative(value)})</span> : null}
    </time>
  );
}
