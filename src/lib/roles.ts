import { ROLES, ROLE_LABELS, type Role } from '../domain/people/roles';

/** One line per role, in plain words, used on the invite form and the profile. */
export const ROLE_DUTIES: Record<Role, string> = {
  admin: 'Invites people, sets their roles and looks after this install.',
  conductor: 'Runs the countdown, calls polls and holds.',
  safety: 'Keeps the hazard analysis and can stop a count.',
  operator: 'Answers go/no-go polls for a station.',
  auditor: 'Reads counts and records; changes nothing.',
};

export const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role], description: ROLE_DUTIES[role] }));

export function roleList(roles: readonly Role[]): string {
  return roles.map((role) => ROLE_LABELS[role]).join(', ');
}
