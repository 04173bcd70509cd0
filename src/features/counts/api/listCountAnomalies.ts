import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnomalySummaryDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { countKeys } from './keys';

/** The anomalies reported at instants of this count, for the replay's timeline and jumps. */
export function listCountAnomalies(countId: number, signal?: AbortSignal) {
  return api.get<AnomalySummaryDto[]>(`/api/anomalies?countId=${countId}`, { signal });
}

export const countAnomaliesQueryOptions = (countId: number) =>
  queryOptions({ queryKey: [...countKeys.detail(countId), 'anomalies'], queryFn: ({ signal }) => listCountAnomalies(countId, signal) });

export function useCountAnomalies(countId: number) {
  return useQuery(countAnomaliesQueryOptions(countId));
}
