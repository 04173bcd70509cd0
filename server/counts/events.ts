/**
 * What else happens when a count's events are stored: the count's row keeps its last status for lists, and a
 * scrub notice goes by e-mail to everyone on the crew. Both run after the events are committed and never hold
 * up the count: a failed mail is logged, not retried into the log.
 */
import type { CountEventDto } from '../../src/contract/count';
import { HOLD_CATEGORY_LABELS } from '../../src/domain/count/events';
import type { CountState } from '../../src/domain/count/state';
import { tAt } from '../../src/domain/count/state';
import { formatTMinus } from '../../src/domain/procedures/tminus';
import type { Notifier } from '../mail/notify';
import { countReportMail, scrubNoticeMail } from '../mail/templates';
import { countReport } from '../../src/domain/count/report';
import type { CountEvent } from '../../src/domain/count/events';
import { Count } from '../models';

export class CountEvents {
  private pending = new Set<Promise<unknown>>();
  /** Status writes in the order the events happened. */
  private statusChain: Promise<unknown> = Promise.resolve();
  /** The status last written per count: most events (answers, presence) change none, and write nothing. */
  private written = new Map<number, string>();

  constructor(
    private readonly deps: {
      notifier: Notifier;
      appUrl: string;
      log: (message: string, error?: unknown) => void;
      /** The count's whole log with hashes, for the report (committed before this runs). */
      readLog?: (countId: number) => Promise<(CountEvent & { hash: string })[]>;
    },
  ) {}

  handle(count: { id: number; state: CountState }, events: CountEventDto[]): void {
    const status = count.state.status;
    if (this.written.get(count.id) !== status) this.writeStatus(count.id, status);
    for (const e of events) {
      if (e.type === 'count:scrubbed') this.track(this.scrubNotice(count, e));
    }
    // The count ends when safing is closed, or at a scrub when it has no safing steps: then the report goes out.
    const ended = status === 'scrubbed' || status === 'complete';
    if (ended && events.some((e) => e.type === 'count:safed' || e.type === 'count:scrubbed')) this.track(this.reportMail(count));
  }

  private writeStatus(id: number, status: string) {
    this.written.set(id, status);
    const count = { id };
    this.statusChain = this.statusChain.then(() => Count.update({ status }, { where: { id: count.id } })).catch((error) => this.deps.log('count status update failed', error));
    this.track(this.statusChain);
  }

  private track(p: Promise<unknown>) {
    const guarded = p.catch((error) => this.deps.log('count follow-up failed', error));
    this.pending.add(guarded);
    void guarded.finally(() => this.pending.delete(guarded));
  }

  private crewIds(state: CountState): number[] {
    return [...new Set((state.plan?.crew ?? []).flatMap((c) => c.userIds))];
  }

  private async scrubNotice(count: { id: number; state: CountState }, e: Extract<CountEventDto, { type: 'count:scrubbed' }>) {
    const plan = count.state.plan;
    if (!plan) return;
    const mail = scrubNoticeMail({
      to: [],
      countName: plan.name,
      category: HOLD_CATEGORY_LABELS[e.payload.category],
      reason: e.payload.reason,
      scrubbedBy: e.actor?.name ?? 'the test conductor',
      at: new Date(e.at),
      tMinus: formatTMinus(Math.round(tAt(count.state, e.at))),
      link: `${this.deps.appUrl}/counts/${count.id}`,
    });
    await this.deps.notifier.deliver('scrub-notice', this.crewIds(count.state), () => mail);
  }

  /** The count report to the crew once the count has ended (safing closed, after a firing or a scrub). */
  private async reportMail(count: { id: number; state: CountState }) {
    const ids = this.crewIds(count.state);
    if (ids.length === 0 || !this.deps.readLog) return;
    const r = countReport(await this.deps.readLog(count.id));
    const t = (s: number) => formatTMinus(Math.round(s));
    const secs = (s: number) => `${Math.round(s)} s`;
    const lines = [
      r.scrub ? `Scrubbed at ${t(r.scrub.atT)}: ${HOLD_CATEGORY_LABELS[r.scrub.category]}, ${r.scrub.reason}` : r.actualT0At !== null ? `T-0 at ${new Date(r.actualT0At).toUTCString()}` : 'T-0 was not reached',
      r.slipSeconds !== null ? `Against the plan: ${r.slipSeconds > 0 ? `${secs(r.slipSeconds)} late` : r.slipSeconds < 0 ? `${secs(-r.slipSeconds)} early` : 'on time'}` : null,
      `Holds: ${r.holds.count}, ${secs(r.holds.totalSeconds)} in all${r.holds.list.map((h) => `; ${h.holdId} at ${t(h.calledAtT)} by ${h.calledByStation ?? h.calledBy?.name ?? h.source}: ${HOLD_CATEGORY_LABELS[h.category]}, ${h.reason}`).join('')}`,
      `Recycles: ${r.recycles.length}${r.recycles.map((c) => `; to ${t(c.toT)}: ${c.reason}`).join('')}`,
      `Polls: ${r.polls.count} (${r.polls.passed} passed, ${r.polls.failed} failed)`,
      `Readings out of limits: ${r.redlines.length}${r.redlines.map((x) => `; ${t(x.t)} ${x.station}: ${x.message}`).join('')}`,
    ].filter((l): l is string => l !== null);
    const mail = countReportMail({ to: [], countName: count.state.plan?.name ?? `Count ${count.id}`, lines, lastHash: r.lastHash, link: `${this.deps.appUrl}/counts/${count.id}/report` });
    await this.deps.notifier.deliver('count-report', ids, () => mail);
  }

  /** Waits for follow-ups in flight (shutdown, tests). */
  async settle(): Promise<void> {
    await Promise.all([...this.pending]);
  }
}
