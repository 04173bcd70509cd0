import type { HazardListQuery } from '../../../contract/hazards';

/** Hierarchical keys: invalidating ['hazards'] refreshes every list, detail and history at once. */
export const hazardKeys = {
  all: ['hazards'] as const,
  lists: () => ['hazards', 'list'] as const,
  list: (filters: HazardListQuery = {}) => ['hazards', 'list', filters] as const,
  details: () => ['hazards', 'detail'] as const,
  detail: (id: number) => ['hazards', 'detail', id] as const,
  history: (id: number) => ['hazards', 'detail', id, 'history'] as const,
};

export const propellantKeys = {
  all: ['propellants'] as const,
  list: () => ['propellants', 'list'] as const,
  detail: (id: string) => ['propellants', 'detail', id] as const,
  history: (id: string) => ['propellants', 'detail', id, 'history'] as const,
};

export const matrixKeys = {
  all: ['risk-matrices'] as const,
  list: () => ['risk-matrices', 'list'] as const,
  detail: (id: string) => ['risk-matrices', 'detail', id] as const,
};

export const calcKeys = {
  all: ['calc'] as const,
  one: (name: string, inputs: Record<string, unknown>) => ['calc', name, inputs] as const,
};
