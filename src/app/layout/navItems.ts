import type { Role } from '../../domain/people/roles';

export interface NavItem {
  to: string;
  label: string;
  end?: boolean;
  /** Shown only to holders of one of these roles; absent means everyone signed in. */
  roles?: readonly Role[];
}

export const NAV_ITEMS: readonly NavItem[] = [
  { to: '/', label: 'Home', end: true },
  { to: '/hazards', label: 'Hazards' },
  { to: '/procedures', label: 'Procedures' },
  { to: '/counts', label: 'Live count' },
  { to: '/anomalies', label: 'Anomalies' },
  { to: '/records', label: 'Records' },
  { to: '/admin/people', label: 'People', roles: ['admin'] },
  { to: '/admin/mail', label: 'Mail outbox', roles: ['admin'] },
  { to: '/profile', label: 'Profile' },
];
