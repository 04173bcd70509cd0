/**
 * The count's own timeline on the sensor plot's axis, taken from the count report (which folds the log with the
 * count's reducer): actual T-0, the holds and the out-of-limits readings. The axis is seconds of wall-clock time
 * from the actual T-0, the same as the sensor data's; before the last hold it differs from the count clock's T by
 * the holds still to come, since the count clock stands still in a hold and the sensors do not. Pure.
 */
import type { CountReport } from '../count/report';

export interface TimelineHold {
  holdId: string;
  category: string;
  reason: string;
  /** Seconds from actual T-0: the call, and the end of the hold period (the report's end for a hold still open). */
  fromT: number;
  toT: number;
}

export interface TimelineRedline {
  /** Seconds from actual T-0, or the count clock's T when the count never reached T-0. */
  t: number;
  instruction: string;
  station: string;
  value: number;
  unit: string;
  message: string;
}

export interface SensorTimeline {
  /** Epoch ms of the actual T-0; null when the count never reached it. */
  t0At: number | null;
  holds: TimelineHold[];
  redlines: TimelineRedline[];
  /** Holds the plot cannot place because the count never reached T-0. */
  unplacedHolds: number;
}

export function sensorTimeline(report: Pick<CountReport, 'actualT0At' | 'holds' | 'redlines'>): SensorTimeline {
  const t0 = report.actualT0At;
  if (t0 === null) {
    return {
      t0At: null,
      holds: [],
      redlines: report.redlines.map((r) => ({ t: r.t, instruction: r.instruction, station: r.station, value: r.value, unit: r.unit, message: r.message })),
      unplacedHolds: report.holds.list.length,
    };
  }
  const rel = (ms: number) => (ms - t0) / 1000;
  return {
    t0At: t0,
    holds: report.holds.list.map((h) => ({
      holdId: h.holdId,
      category: h.category,
      reason: h.reason,
      fromT: rel(h.calledAt),
      toT: rel(h.calledAt) + h.seconds,
    })),
    redlines: report.redlines.map((r) => ({ t: rel(r.at), instruction: r.instruction, station: r.station, value: r.value, unit: r.unit, message: r.message })),
    unplacedHolds: 0,
  };
}
