/**
 * E-mail notices: which kinds exist, and how each person takes each kind: at once, gathered into one daily digest,
 * or not at all. Everyone starts with every notice at once.
 */
import { z } from 'zod';

export const NOTIFICATION_KINDS = ['count-scheduled', 'scrub-notice', 'count-report', 'acceptance-needed', 'signoff-needed', 'action-assigned'] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

export const DELIVERIES = ['immediate', 'digest', 'off'] as const;
export type Delivery = (typeof DELIVERIES)[number];

export const NOTIFICATION_LABELS: Readonly<Record<NotificationKind, { label: string; hint: string }>> = {
  'count-scheduled': { label: 'You are on a count’s crew', hint: 'The count, your station and when to report.' },
  'scrub-notice': { label: 'A count you are on is scrubbed', hint: 'Why, when and by whom.' },
  'count-report': { label: 'Count report', hint: 'Holds, recycles, polls and readings, when a count you were on ends.' },
  'acceptance-needed': { label: 'A hazard needs your acceptance', hint: 'When a hazard asks for the role you hold to accept its residual risk.' },
  'signoff-needed': { label: 'A procedure needs your sign-off', hint: 'When one signature is given and the role you hold is still missing.' },
  'action-assigned': { label: 'A corrective action is assigned to you', hint: 'From an anomaly report, with its due date.' },
};

export const DELIVERY_LABELS: Readonly<Record<Delivery, string>> = {
  immediate: 'At once',
  digest: 'In the daily digest',
  off: 'Off',
};

export type NotificationPrefs = Record<NotificationKind, Delivery>;

export const DEFAULT_NOTIFICATION_PREFS: NotificationPrefs = Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, 'immediate'])) as NotificationPrefs;

const delivery = z.enum(DELIVERIES, `Choose one of: ${DELIVERIES.join(', ')}`);

/** PUT /api/profile/notifications: any of the kinds; those left out keep their setting. */
export const notificationPrefsInputSchema = z.strictObject(
  Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, delivery.optional()])) as Record<NotificationKind, z.ZodOptional<typeof delivery>>,
);
export type NotificationPrefsInput = z.input<typeof notificationPrefsInputSchema>;

export interface NotificationPrefsDto {
  prefs: NotificationPrefs;
  /** The hour (UTC, 0 to 23) the daily digest goes out. */
  digestHourUtc: number;
  /** Notices waiting for your next digest. */
  waiting: number;
}
