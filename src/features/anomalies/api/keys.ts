import type { AnomalyListQuery } from '../../../contract/anomalies';

/** Hierarchical keys: invalidating ['anomalies'] refreshes every list and detail at once. */
export const anomalyKeys = {
  all: ['anomalies'] as const,
  lists: () => ['anomalies', 'list'] as const,
  list: (filters: AnomalyListQuery = {}) => ['anomalies', 'list', filters] as const,
  detail: (id: number) => ['anomalies', 'detail', id] as const,
  people: () => ['anomalies', 'people'] as const,
  choices: (what: 'hazards' | 'procedures' | 'counts' | 'matrices') => ['anomalies', 'choices', what] as const,
};
