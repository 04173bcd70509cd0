import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnomalyListQuery, AnomalySummaryDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

export function fetchAnomalies(filters: AnomalyListQuery = {}, signal?: AbortSignal) {
  const qs = new URLSearchParams(Object.entries(filters).filter(([, v]) => v !== undefined && v !== '').map(([k, v]) => [k, String(v)])).toString();
  return api.get<AnomalySummaryDto[]>(`/api/anomalies${qs ? `?${qs}` : ''}`, { signal });
}

export function anomaliesQueryOptions(filters: AnomalyListQuery = {}) {
  return queryOptions({ queryKey: anomalyKeys.list(filters), queryFn: ({ signal }) => fetchAnomalies(filters, signal) });
}

export function useAnomalies(filters: AnomalyListQuery = {}) {
  return useQuery(anomaliesQueryOptions(filters));
}
