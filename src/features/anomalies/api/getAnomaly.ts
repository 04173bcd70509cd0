import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

export function fetchAnomaly(id: number, signal?: AbortSignal) {
  return api.get<AnomalyDto>(`/api/anomalies/${id}`, { signal });
}

export function anomalyQueryOptions(id: number) {
  return queryOptions({ queryKey: anomalyKeys.detail(id), queryFn: ({ signal }) => fetchAnomaly(id, signal) });
}

export function useAnomaly(id: number) {
  return useQuery(anomalyQueryOptions(id));
}
