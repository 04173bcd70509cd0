import { describe, expect, it } from 'vitest';
import { estimateOffset, sampleOffset, serverTime } from '../../src/domain/count';

// RFC 5905 (NTPv4), section 8, "On-Wire Protocol": with T1 the client's send time, T2 the server's receive
// time, T3 the server's send time and T4 the client's receive time,
//   offset theta = 1/2 [(T2 - T1) + (T3 - T4)]    and    delay delta = (T4 - T1) - (T3 - T2).
describe('clock offset from one exchange (RFC 5905 section 8)', () => {
  it('worked example: server 500 ms ahead, 100 ms each way, answered at once', () => {
    // T1 = 10 000 (client); arrives at client time 10 100 = server time 10 600 = T2 = T3; back at T4 = 10 200.
    // theta = ((10 600 - 10 000) + (10 600 - 10 200)) / 2 = (600 + 400) / 2 = 500; delta = 200 - 0 = 200.
    expect(sampleOffset({ clientSentAt: 10_000, serverAt: 10_600, clientReceivedAt: 10_200 })).toEqual({ offset: 500, delay: 200 });
  });

  it('takes the server’s own time out of the delay when it reports T3', () => {
    // T2 = 10 600, T3 = 10 630 (30 ms inside the server), T4 = 10 230: theta = (600 + 400) / 2 = 500; delta = 230 - 30 = 200.
    expect(sampleOffset({ clientSentAt: 10_000, serverAt: 10_600, serverSentAt: 10_630, clientReceivedAt: 10_230 })).toEqual({ offset: 500, delay: 200 });
  });

  it('errs by at most half the delay when the paths differ', () => {
    // From the formulas above: theta is off by half the difference of the two one-way times, at most delta / 2.
    // True offset 500; 50 ms out, 150 ms back: T2 = 10 550, T4 = 10 200. theta = (550 + 350) / 2 = 450: 50 off, <= 200 / 2.
    const s = sampleOffset({ clientSentAt: 10_000, serverAt: 10_550, clientReceivedAt: 10_200 });
    expect(s).toEqual({ offset: 450, delay: 200 });
    expect(Math.abs(s.offset - 500)).toBeLessThanOrEqual(s.delay / 2);
  });
});

describe('estimateOffset', () => {
  it('trusts the sample with the shortest round trip in the window', () => {
    const samples = [
      { clientSentAt: 0, serverAt: 900, clientReceivedAt: 1_000 }, // offset 400, delay 1000: outside a window of 3
      { clientSentAt: 2_000, serverAt: 2_800, clientReceivedAt: 2_400 }, // offset 600, delay 400
      { clientSentAt: 3_000, serverAt: 3_540, clientReceivedAt: 3_080 }, // offset 500, delay 80
      { clientSentAt: 4_000, serverAt: 4_700, clientReceivedAt: 4_300 }, // offset 550, delay 300
    ];
    expect(estimateOffset(samples, 3)).toEqual({ offset: 500, delay: 80, samples: 3 });
    expect(serverTime(10_000, estimateOffset(samples, 3))).toBe(10_500);
  });

  it('drops samples with a negative round trip and has nothing from none', () => {
    expect(estimateOffset([{ clientSentAt: 5_000, serverAt: 5_000, clientReceivedAt: 4_000 }])).toBeNull();
    expect(estimateOffset([])).toBeNull();
    expect(serverTime(10_000, null)).toBe(10_000);
  });
});
