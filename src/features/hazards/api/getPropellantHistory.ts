import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HistoryEntryDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { propellantKeys } from './keys';

export function fetchPropellantHistory(id: string, signal?: AbortSignal) {
  return api.get<HistoryEntryDto[]>(`/api/propellants/${encodeURIComponent(id)}/history`, { signal });
}

export function propellantHistoryQueryOptions(id: string) {
  return queryOptions({ queryKey: propellantKeys.history(id), queryFn: ({ signal }) => fetchPropellantHistory(id, signal) });
}

export function usePropellantHistory(id: string) {
  return useQuery(propellantHistoryQueryOptions(id));
}
