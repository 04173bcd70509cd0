/**
 * How far the server's clock is from this device's, from request/response samples, the NTP way: the offset
 * of one exchange is the server's time minus the midpoint of the client's send and receive, and the sample
 * with the shortest round trip is trusted most, since its error is at most half its round trip.
 */

export interface ClockSyncSample {
  /** Client clock when the request left (NTP's T1). */
  clientSentAt: number;
  /** Server clock when it answered (T2; also T3 unless serverSentAt is given). */
  serverAt: number;
  /** Server clock when the answer left (T3), when the server reports it separately. */
  serverSentAt?: number;
  /** Client clock when the answer arrived (T4). */
  clientReceivedAt: number;
}

export interface ClockOffset {
  /** Add to a client time to get server time, ms. */
  offset: number;
  /** The round trip less the server's own time, ms. */
  delay: number;
}

/** One exchange: offset = ((T2 - T1) + (T3 - T4)) / 2, delay = (T4 - T1) - (T3 - T2). */
export function sampleOffset(s: ClockSyncSample): ClockOffset {
  const t1 = s.clientSentAt;
  const t2 = s.serverAt;
  const t3 = s.serverSentAt ?? s.serverAt;
  const t4 = s.clientReceivedAt;
  return { offset: (t2 - t1 + (t3 - t4)) / 2, delay: t4 - t1 - (t3 - t2) };
}

/**
 * The offset from the last `window` samples: the one with the least delay. Samples with a negative delay
 * (a client clock that jumped backwards mid-exchange) are dropped. Null when no usable sample is left.
 */
export function estimateOffset(samples: readonly ClockSyncSample[], window = 8): (ClockOffset & { samples: number }) | null {
  const usable = samples.slice(-window).map(sampleOffset).filter((o) => o.delay >= 0);
  if (usable.length === 0) return null;
  const best = usable.reduce((a, b) => (b.delay < a.delay ? b : a));
  return { ...best, samples: usable.length };
}

/** Server time now, from the client's clock and an offset. */
export function serverTime(clientNow: number, offset: ClockOffset | null): number {
  return clientNow + (offset?.offset ?? 0);
}
