/** Crew manning: every station a procedure needs has at least one active person assigned to it. */
import type { Phase } from './steps';

/** The stations a revision needs, in first-use order: the procedure's own list, then each step's and each poll's. */
export function neededStations(phases: readonly Phase[], listed: readonly string[] = []): string[] {
  const out = new Set<string>(listed);
  for (const phase of phases) {
    for (const step of phase.steps) {
      out.add(step.station);
      if (step.kind === 'poll') for (const s of step.stations) out.add(s);
    }
  }
  return [...out].filter((s) => s.trim() !== '');
}

export interface Assignment {
  station: string;
  userId: number;
  userName: string;
  /** A deactivated account cannot sign in to answer a poll, so it does not man a station. */
  active: boolean;
}

export interface StationManning {
  station: string;
  people: { userId: number; userName: string }[];
  manned: boolean;
}

export interface ManningCheck {
  /** True when every needed station has at least one active person. */
  ok: boolean;
  stations: StationManning[];
  unmanned: string[];
  /** Assignments that do not count: the account is deactivated. */
  inactive: { station: string; userId: number; userName: string }[];
  /** People assigned to more than one needed station: allowed, but worth a look before the day. */
  doubled: { userId: number; userName: string; stations: string[] }[];
}

export function manningCheck(needed: readonly string[], assignments: readonly Assignment[]): ManningCheck {
  const stations = needed.map((station): StationManning => {
    const people = assignments.filter((a) => a.station === station && a.active).map((a) => ({ userId: a.userId, userName: a.userName }));
    return { station, people, manned: people.length > 0 };
  });
  const neededSet = new Set(needed);
  const byPerson = new Map<number, { userId: number; userName: string; stations: string[] }>();
  for (const a of assignments) {
    if (!a.active || !neededSet.has(a.station)) continue;
    const entry = byPerson.get(a.userId) ?? { userId: a.userId, userName: a.userName, stations: [] };
    if (!entry.stations.includes(a.station)) entry.stations.push(a.station);
    byPerson.set(a.userId, entry);
  }
  const unmanned = stations.filter((s) => !s.manned).map((s) => s.station);
  return {
    ok: unmanned.length === 0,
    stations,
    unmanned,
    inactive: assignments.filter((a) => !a.active).map(({ station, userId, userName }) => ({ station, userId, userName })),
    doubled: [...byPerson.values()].filter((p) => p.stations.length > 1),
  };
}
