import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CountSummaryDto } from '../../../contract/count';
import { api } from '../../../lib/api';
import { countKeys } from './keys';

export function fetchCounts(signal?: AbortSignal) {
  return api.get<CountSummaryDto[]>('/api/counts', { signal });
}

export function countsQueryOptions() {
  return queryOptions({ queryKey: countKeys.lists(), queryFn: ({ signal }) => fetchCounts(signal) });
}

export function useCounts() {
  return useQuery(countsQueryOptions());
}
