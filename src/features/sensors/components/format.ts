/** Words and numbers for the sensor page. */
import { formatTMinus } from '../../../domain/procedures/tminus';

/**
 * -31.4 -> "T-31.40 s", 2.5 -> "T+2.50 s", 0 -> "T-0"; a minute or more away from T-0 reads as the count's clock
 * does, to the second: -4739 -> "T-1:18:59".
 */
export function formatT(seconds: number): string {
  if (Math.abs(seconds) < 0.005) return 'T-0';
  if (Math.abs(seconds) >= 59.995) return formatTMinus(Math.round(seconds));
  return `T${seconds < 0 ? '-' : '+'}${Math.abs(seconds).toFixed(2)} s`;
}

/** A reading with a sensible number of digits: 27.3148 -> "27.31", 0.004 -> "0.004", 0.00002 -> "2.00e-5". */
export function formatValue(value: number, unit: string): string {
  const abs = Math.abs(value);
  const text = abs !== 0 && (abs < 0.0005 || abs >= 1e6) ? value.toExponential(2) : abs < 1 ? value.toFixed(3) : value.toFixed(2);
  return unit ? `${text} ${unit}` : text;
}

export function limitsWords(low: number | null, high: number | null, unit: string): string {
  if (low === null && high === null) return 'none';
  if (low !== null && high !== null) return `${formatValue(low, unit)} to ${formatValue(high, unit)}`;
  return low !== null ? `at least ${formatValue(low, unit)}` : `at most ${formatValue(high!, unit)}`;
}
