import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HistoryEntryDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export function fetchHazardHistory(id: number, signal?: AbortSignal) {
  return api.get<HistoryEntryDto[]>(`/api/hazards/${id}/history`, { signal });
}

export function hazardHistoryQueryOptions(id: number) {
  return queryOptions({ queryKey: hazardKeys.history(id), queryFn: ({ signal }) => fetchHazardHistory(id, signal) });
}

export function useHazardHistory(id: number) {
  return useQuery(hazardHistoryQueryOptions(id));
}
