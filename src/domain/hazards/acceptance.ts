/**
 * Who must sign to accept a residual risk. MIL-STD-882E section 4.3.7 sets an
 * acceptance authority per risk level (higher level, higher authority); a team
 * maps those authorities to its own roles (common practice, no source).
 */
import { isRole, type Role } from '../people/roles';
import type { RiskMatrix } from './matrix';

/** Level key -> roles that must each sign, each by a different person. */
export type AcceptanceMap = Readonly<Record<string, readonly Role[]>>;

/**
 * Built-in map for the MIL-STD-882E levels. High and Serious need the safety
 * officer and an admin acting as test director: two people, standing in for
 * the higher authority and user-representative concurrence.
 */
export const DEFAULT_ACCEPTANCE_MAP: AcceptanceMap = {
  high: ['safety', 'admin'],
  serious: ['safety', 'admin'],
  medium: ['safety'],
  low: ['safety'],
  eliminated: ['safety'],
};

export interface AcceptanceSignature {
  userId: string;
  role: Role;
}

export interface AcceptanceProgress {
  complete: boolean;
  missingRoles: Role[];
  problems: string[];
}

function sameSignature(a: AcceptanceSignature, b: AcceptanceSignature): boolean {
  return a.userId === b.userId && a.role === b.role;
}

/**
 * Assigns people to required roles so no person fills two (augmenting-path
 * matching: a person who signed twice is placed where they are needed most).
 */
function assignPeople(required: readonly Role[], signatures: readonly AcceptanceSignature[]): Map<Role, string> {
  const byRole = new Map<Role, string>();
  const byUser = new Map<string, Role>();
  const tryPlace = (role: Role, visited: Set<string>): boolean => {
    for (const sig of signatures) {
      if (sig.role !== role || visited.has(sig.userId)) continue;
      visited.add(sig.userId);
      const held = byUser.get(sig.userId);
      if (held === undefined || tryPlace(held, visited)) {
        byRole.set(role, sig.userId);
        byUser.set(sig.userId, role);
        return true;
      }
    }
    return false;
  };
  for (const role of required) tryPlace(role, new Set());
  return byRole;
}

function signatureProblems(
  required: readonly Role[],
  signatures: readonly AcceptanceSignature[],
  missingRoles: readonly Role[],
): string[] {
  const problems: string[] = [];
  signatures.forEach((sig, i) => {
    if (!sig.userId || !sig.userId.trim()) problems.push(`Signature ${i + 1} has no person.`);
    if (!isRole(sig.role)) problems.push(`Signature ${i + 1} has an unknown role '${String(sig.role)}'.`);
    else if (!required.includes(sig.role)) problems.push(`The ${sig.role} role is not required for this level; that signature does not count.`);
    if (signatures.findIndex((s) => sameSignature(s, sig)) < i) problems.push(`${sig.userId} signed as ${sig.role} more than once.`);
  });
  const users = new Set(signatures.map((s) => s.userId));
  for (const user of users) {
    const roles = [...new Set(signatures.filter((s) => s.userId === user && required.includes(s.role)).map((s) => s.role))];
    // Only worth saying when it is why a role is still open.
    if (roles.length > 1 && missingRoles.length > 0) problems.push(`${user} signed as ${roles.join(' and ')}; one person can fill only one required role.`);
  }
  return problems;
}

/** How far a risk acceptance has got, for one level and the signatures so far. */
export function acceptanceProgress(
  map: AcceptanceMap,
  level: string,
  signatures: readonly AcceptanceSignature[],
): AcceptanceProgress {
  const required = map[level];
  if (!required || required.length === 0) {
    return { complete: false, missingRoles: [], problems: [`No acceptance authority is set for level '${level}'.`] };
  }
  const valid = signatures.filter((s) => s.userId && s.userId.trim() && isRole(s.role));
  const assigned = assignPeople(required, valid);
  const missingRoles = required.filter((role) => !assigned.has(role));
  return { complete: missingRoles.length === 0, missingRoles, problems: signatureProblems(required, signatures, missingRoles) };
}

export interface AcceptanceMapProblem {
  /** The level the problem is about, or null when it concerns the map as a whole. */
  level: string | null;
  message: string;
}

/**
 * Checks a team's map against its matrix: every level has authorities, roles
 * are known, and a worse level never needs fewer roles than a milder one.
 */
export function checkAcceptanceMap(map: AcceptanceMap, matrix: RiskMatrix): AcceptanceMapProblem[] {
  const problems: AcceptanceMapProblem[] = [];
  for (const level of matrix.levels) {
    const roles = map[level.key];
    if (!roles || roles.length === 0) problems.push({ level: level.key, message: `Level '${level.key}' has no acceptance authority.` });
    else {
      const unknown = roles.filter((r) => !isRole(r));
      if (unknown.length) problems.push({ level: level.key, message: `Level '${level.key}' names unknown roles: ${unknown.join(', ')}.` });
      if (new Set(roles).size !== roles.length) problems.push({ level: level.key, message: `Level '${level.key}' lists a role twice.` });
      // Auditors read the record; a signature from them would make them part of what they audit.
      if (roles.includes('auditor')) problems.push({ level: level.key, message: `Level '${level.key}' names the auditor, who reads the record and does not accept risk.` });
    }
  }
  for (const key of Object.keys(map)) {
    if (!matrix.levels.some((l) => l.key === key)) problems.push({ level: null, message: `The map names level '${key}', which the matrix does not have.` });
  }
  const ordered = [...matrix.levels].sort((a, b) => a.rank - b.rank);
  for (let i = 1; i < ordered.length; i++) {
    const milder = map[ordered[i - 1].key] ?? [];
    const worse = map[ordered[i].key] ?? [];
    if (!milder.every((r) => worse.includes(r))) {
      problems.push({
        level: ordered[i].key,
        message: `Level '${ordered[i].key}' needs fewer authorities than the milder level '${ordered[i - 1].key}'.`,
      });
    }
  }
  return problems;
}

/** checkAcceptanceMap as plain messages. */
export function validateAcceptanceMap(map: AcceptanceMap, matrix: RiskMatrix): string[] {
  return checkAcceptanceMap(map, matrix).map((p) => p.message);
}
