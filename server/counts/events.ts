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
import type { Mailer } from '../mail/mailer';
import { scrubNoticeMail } from '../mail/templates';
import { Count, User } from '../models';

export class CountEvents {
  private pending = new Set<Promise<unknown>>();
  /** Status writes in the order the events happened. */
  private statusChain: Promise<unknown> = Promise.resolve();
  /** The status last written per count: most events (answers, presence) change none, and write nothing. */
  private written = new Map<number, string>();

  constructor(private readonly deps: { mailer: Mailer; appUrl: string; log: (message: string, error?: unknown) => void }) {}

  handle(count: { id: number; state: CountState }, events: CountEventDto[]): void {
    const status = count.state.status;
    if (this.written.get(count.id) !== status) this.writeStatus(count.id, status);
    for (const e of events) {
      if (e.type === 'count:scrubbed') this.track(this.scrubNotice(count, e));
    }
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

  private async scrubNotice(count: { id: number; state: CountState }, e: Extract<CountEventDto, { type: 'count:scrubbed' }>) {
    const plan = count.state.plan;
    if (!plan) return;
    const ids = [...new Set(plan.crew.flatMap((c) => c.userIds))];
    if (ids.length === 0) return;
    const users = await User.findAll({ where: { id: ids, active: true }, attributes: ['email'] });
    if (users.length === 0) return;
    await this.deps.mailer.send(
      scrubNoticeMail({
        to: users.map((u) => u.email),
        countName: plan.name,
        category: HOLD_CATEGORY_LABELS[e.payload.category],
        reason: e.payload.reason,
        scrubbedBy: e.actor?.name ?? 'the test conductor',
        at: new Date(e.at),
        tMinus: formatTMinus(Math.round(tAt(count.state, e.at))),
        link: `${this.deps.appUrl}/counts/${count.id}`,
      }),
    );
  }

  /** Waits for follow-ups in flight (shutdown, tests). */
  async settle(): Promise<void> {
    await Promise.all([...this.pending]);
  }
}
