/**
 * E-mail notices, each sent as its recipient chose for its kind (src/contract/notifications.ts): at once, kept for
 * the daily digest, or not at all. One path for every notice: the mailer (nodemailer over SMTP; the local catcher in
 * development and tests). A notice never holds up what caused it: a failed send is logged, not retried.
 */
import { Op } from 'sequelize';
import {
  DEFAULT_NOTIFICATION_PREFS,
  NOTIFICATION_LABELS,
  type Delivery,
  type NotificationKind,
  type NotificationPrefs,
} from '../../src/contract/notifications';
import type { Mailer } from './mailer';
import { NotificationDigestItem, User } from '../models';

export interface Notice {
  subject: string;
  text: string;
}

export function prefsOf(user: Pick<User, 'notificationPrefs'>): NotificationPrefs {
  return { ...DEFAULT_NOTIFICATION_PREFS, ...(user.notificationPrefs ?? {}) };
}

export class Notifier {
  private pending = new Set<Promise<unknown>>();

  constructor(
    private readonly deps: {
      mailer: Mailer;
      log: (message: string, error?: unknown) => void;
      /** The hour (UTC) the daily digest goes out. */
      digestHourUtc: number;
      appUrl: string;
    },
  ) {}

  get digestHourUtc(): number {
    return this.deps.digestHourUtc;
  }

  /** Where links in notices point. */
  get appUrl(): string {
    return this.deps.appUrl;
  }

  /**
   * Sends `notice(user)` to each of `userIds` (active members only) as each chose for `kind`. Returns at once; the
   * sending is tracked (see `settle`).
   */
  notify(kind: NotificationKind, userIds: readonly number[], notice: (user: User) => Notice): void {
    const ids = [...new Set(userIds)];
    if (ids.length === 0) return;
    this.track(this.deliver(kind, ids, notice));
  }

  /** The same, awaited: for callers that already run after the fact. */
  async deliver(kind: NotificationKind, userIds: readonly number[], notice: (user: User) => Notice): Promise<Record<Delivery, number>> {
    const done: Record<Delivery, number> = { immediate: 0, digest: 0, off: 0 };
    const users = await User.findAll({ where: { id: [...new Set(userIds)], active: true } });
    for (const user of users) {
      const how = prefsOf(user)[kind];
      done[how] += 1;
      if (how === 'off') continue;
      const n = notice(user);
      if (how === 'digest') {
        await NotificationDigestItem.create({ userId: user.id, kind, subject: n.subject, body: n.text, sentAt: null });
      } else {
        await this.deps.mailer.send({ to: user.email, subject: n.subject, text: `${n.text}\n\n${this.footer()}` });
      }
    }
    return done;
  }

  /**
   * One mail per person with everything kept for their digest since the last one, then marked sent. Returns how many
   * digests went out. Items of people no longer active are dropped with the rest.
   */
  async sendDigests(now = new Date()): Promise<number> {
    const items = await NotificationDigestItem.findAll({ where: { sentAt: { [Op.is]: null } }, order: [['id', 'ASC']] });
    const byUser = new Map<number, NotificationDigestItem[]>();
    for (const item of items) byUser.set(item.userId as number, [...(byUser.get(item.userId as number) ?? []), item]);
    let sent = 0;
    for (const [userId, list] of byUser) {
      const user = await User.findByPk(userId);
      if (user?.active) {
        const parts = list.map((i, n) => `${n + 1}. ${i.subject}\n   (${NOTIFICATION_LABELS[i.kind as NotificationKind]?.label ?? i.kind}, ${i.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC)\n\n${indent(i.body)}`);
        await this.deps.mailer.send({
          to: user.email,
          subject: `Holdfire daily digest: ${list.length} notice${list.length === 1 ? '' : 's'}`,
          text: `Good morning ${user.name}. Since your last digest:\n\n${parts.join('\n\n')}\n\n${this.footer()}`,
        });
        sent += 1;
      }
      await NotificationDigestItem.update({ sentAt: now }, { where: { id: list.map((i) => i.id) } });
    }
    return sent;
  }

  private footer(): string {
    return `Choose which notices you get, and how, on your profile: ${this.deps.appUrl}/profile\nHoldfire is a planning and record aid, not a safety authority.`;
  }

  private track(p: Promise<unknown>) {
    const guarded = p.catch((error) => this.deps.log('notice not sent', error));
    this.pending.add(guarded);
    void guarded.finally(() => this.pending.delete(guarded));
  }

  /** Waits for notices in flight (shutdown, tests). */
  async settle(): Promise<void> {
    await Promise.all([...this.pending]);
  }
}

/** Everyone active in the team holding one of `roles`, but `except`. */
export async function roleHolders(teamId: number, roles: readonly string[], except: number): Promise<number[]> {
  const people = await User.findAll({ where: { teamId, active: true }, attributes: ['id', 'roles'] });
  return people.filter((u) => u.id !== except && u.roles.some((r) => roles.includes(r))).map((u) => u.id);
}

function indent(text: string): string {
  return text
    .split('\n')
    .map((l) => (l ? `   ${l}` : l))
    .join('\n');
}

/** Milliseconds from `now` to the next `hourUtc`:00 UTC (tomorrow's when that hour has passed today). */
export function msUntilDigest(now: Date, hourUtc: number): number {
  const next = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate(), hourUtc, 0, 0, 0));
  if (next.getTime() <= now.getTime()) next.setUTCDate(next.getUTCDate() + 1);
  return next.getTime() - now.getTime();
}

/** Sends the digests every day at `hourUtc`; returns a function that stops it. */
export function startDigestTimer(notifier: Notifier, log: (message: string, error?: unknown) => void): () => void {
  let timer: NodeJS.Timeout | undefined;
  const arm = () => {
    timer = setTimeout(() => {
      notifier
        .sendDigests()
        .catch((error) => log('daily digest failed', error))
        .finally(arm);
    }, msUntilDigest(new Date(), notifier.digestHourUtc));
    timer.unref();
  };
  arm();
  return () => clearTimeout(timer);
}
