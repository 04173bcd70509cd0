/**
 * Revisions and their two-person release: a draft is released by a test conductor and a safety officer who
 * are two different people, and only a released revision (the latest one) can be counted.
 */

export const REVISION_STATUSES = ['draft', 'released'] as const;
export type RevisionStatus = (typeof REVISION_STATUSES)[number];

export const SIGNOFF_ROLES = ['conductor', 'safety'] as const;
export type SignoffRole = (typeof SIGNOFF_ROLES)[number];

export interface Signoff {
  role: SignoffRole;
  userId: number;
}

export type SignoffRefusal =
  | { ok: false; code: 'not_draft'; message: string }
  | { ok: false; code: 'already_signed'; message: string }
  | { ok: false; code: 'role_already_signed'; message: string }
  | { ok: false; code: 'same_person'; message: string };

/** May this person add this sign-off? (Whether they hold the role is the caller's check.) */
export function checkSignoff(status: RevisionStatus, existing: readonly Signoff[], next: Signoff): { ok: true; releases: boolean } | SignoffRefusal {
  if (status !== 'draft') return { ok: false, code: 'not_draft', message: 'This revision is already released; it cannot be signed again.' };
  const mine = existing.find((s) => s.userId === next.userId);
  if (mine && mine.role === next.role) return { ok: false, code: 'already_signed', message: `You have already signed as ${next.role}.` };
  if (mine) {
    return {
      ok: false,
      code: 'same_person',
      message: `You already signed as ${mine.role}. Release needs two different people: another person must sign as ${next.role}.`,
    };
  }
  if (existing.some((s) => s.role === next.role)) {
    return { ok: false, code: 'role_already_signed', message: `Someone has already signed as ${next.role}.` };
  }
  return { ok: true, releases: isReleasedBy([...existing, next]) };
}

/** Both roles signed, by two different people. */
export function isReleasedBy(signoffs: readonly Signoff[]): boolean {
  const conductor = signoffs.find((s) => s.role === 'conductor');
  const safety = signoffs.find((s) => s.role === 'safety');
  return conductor !== undefined && safety !== undefined && conductor.userId !== safety.userId;
}

export type Countability =
  | { countable: true }
  | { countable: false; reason: 'draft' | 'superseded' | 'empty'; message: string };

/**
 * Can a count run from this revision? Only a released one, and only the latest released: an older revision
 * has been replaced by one the team signed later.
 */
export function countability(
  revision: { status: RevisionStatus; number: number; stepCount: number },
  latestReleasedNumber: number | null,
): Countability {
  if (revision.status !== 'released') {
    return { countable: false, reason: 'draft', message: `Revision ${revision.number} is a draft. Only a released revision, signed by a test conductor and a safety officer, can be counted.` };
  }
  if (latestReleasedNumber !== null && revision.number < latestReleasedNumber) {
    return { countable: false, reason: 'superseded', message: `Revision ${revision.number} has been replaced by revision ${latestReleasedNumber}. Count from the latest released revision.` };
  }
  if (revision.stepCount === 0) return { countable: false, reason: 'empty', message: `Revision ${revision.number} has no steps.` };
  return { countable: true };
}
