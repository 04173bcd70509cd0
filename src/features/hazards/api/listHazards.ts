import { queryOptions, useQuery } from '@tanstack/react-query';
import { hazardListQuerySchema, type HazardDto, type HazardListQuery } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { hazardListQuerySchema };

function toSearch(filters: HazardListQuery): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) {
    if (value !== undefined && value !== '') params.set(key, String(value));
  }
  const text = params.toString();
  return text ? `?${text}` : '';
}

export function fetchHazards(filters: HazardListQuery = {}, signal?: AbortSignal) {
  return api.get<HazardDto[]>(`/api/hazards${toSearch(hazardListQuerySchema.parse(filters))}`, { signal });
}

export function hazardsQueryOptions(filters: HazardListQuery = {}) {
  return queryOptions({ queryKey: hazardKeys.list(filters), queryFn: ({ signal }) => fetchHazards(filters, signal) });
}

export function useHazards(filters: HazardListQuery = {}) {
  return useQuery(hazardsQueryOptions(filters));
}
