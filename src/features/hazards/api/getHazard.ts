import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export function fetchHazard(id: number, signal?: AbortSignal) {
  return api.get<HazardDto>(`/api/hazards/${id}`, { signal });
}

export function hazardQueryOptions(id: number) {
  return queryOptions({ queryKey: hazardKeys.detail(id), queryFn: ({ signal }) => fetchHazard(id, signal) });
}

export function useHazard(id: number) {
  return useQuery(hazardQueryOptions(id));
}
