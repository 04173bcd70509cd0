import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnomalySummaryDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';

/** The anomalies linked to one hazard (under the anomalies' own key, so their changes refresh it). */
export function fetchHazardAnomalies(hazardId: number, signal?: AbortSignal) {
  return api.get<AnomalySummaryDto[]>(`/api/anomalies?hazardId=${hazardId}`, { signal });
}

export function hazardAnomaliesQueryOptions(hazardId: number) {
  return queryOptions({ queryKey: ['anomalies', 'list', { hazardId: String(hazardId) }] as const, queryFn: ({ signal }) => fetchHazardAnomalies(hazardId, signal) });
}

export function useHazardAnomalies(hazardId: number) {
  return useQuery(hazardAnomaliesQueryOptions(hazardId));
}
