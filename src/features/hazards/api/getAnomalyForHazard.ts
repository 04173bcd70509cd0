import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';

/** The anomaly a new hazard is raised from, to fill the hazard form with its values. */
export function fetchAnomalyForHazard(id: number, signal?: AbortSignal) {
  return api.get<AnomalyDto>(`/api/anomalies/${id}`, { signal });
}

export function anomalyForHazardQueryOptions(id: number) {
  return queryOptions({ queryKey: ['anomalies', 'detail', id] as const, queryFn: ({ signal }) => fetchAnomalyForHazard(id, signal) });
}

export function useAnomalyForHazard(id: number | null) {
  return useQuery({ ...anomalyForHazardQueryOptions(id ?? 0), enabled: id !== null });
}
