/** The roles a Holdfire user may hold; a person may hold several. */
export const ROLES = ['admin', 'conductor', 'safety', 'operator', 'auditor'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  conductor: 'Test conductor',
  safety: 'Safety officer',
  operator: 'Station operator',
  auditor: 'Auditor (read only)',
};

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

/** True when the holder has at least one of the wanted roles. */
export function hasAnyRole(held: readonly Role[], wanted: readonly Role[]): boolean {
  return wanted.some((role) => held.includes(role));
}

/** Roles sorted in the canonical order, duplicates removed. */
export function normaliseRoles(roles: readonly Role[]): Role[] {
  return ROLES.filter((role) => roles.includes(role));
}
