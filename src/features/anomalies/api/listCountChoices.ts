import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CountSummaryDto } from '../../../contract/count';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

/** The team's counts, to name the one an anomaly happened in and to filter the list. */
export function fetchCountChoices(signal?: AbortSignal) {
  return api.get<CountSummaryDto[]>('/api/counts', { signal });
}

export function countChoicesQueryOptions() {
  return queryOptions({ queryKey: anomalyKeys.choices('counts'), queryFn: ({ signal }) => fetchCountChoices(signal) });
}

export function useCountChoices() {
  return useQuery(countChoicesQueryOptions());
}
