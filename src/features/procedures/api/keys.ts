/**
 * Hierarchical keys: invalidating ['procedures'] refreshes every list, procedure, revision and diff;
 * ['procedures', 'detail', id] everything about one procedure.
 */
export const procedureKeys = {
  all: ['procedures'] as const,
  lists: () => ['procedures', 'list'] as const,
  details: () => ['procedures', 'detail'] as const,
  detail: (id: number) => ['procedures', 'detail', id] as const,
  revision: (id: number, rev: number) => ['procedures', 'detail', id, 'revision', rev] as const,
  diff: (id: number, from: number, to: number) => ['procedures', 'detail', id, 'diff', from, to] as const,
  /** What steps can link to: the register's hazards and the propellant library, as the editor lists them. */
  refs: () => ['procedures', 'refs'] as const,
  hazardOptions: () => ['procedures', 'refs', 'hazards'] as const,
};

export const stationKeys = {
  all: ['stations'] as const,
  list: () => ['stations', 'list'] as const,
};

export const crewPlanKeys = {
  all: ['crew-plans'] as const,
  list: () => ['crew-plans', 'list'] as const,
  people: () => ['crew-plans', 'people'] as const,
  detail: (id: number) => ['crew-plans', 'detail', id] as const,
  manning: (id: number, procedureId: number, revision?: number) => ['crew-plans', 'detail', id, 'manning', procedureId, revision ?? 'latest'] as const,
};
