import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PropellantDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { propellantKeys } from './keys';

export function fetchPropellants(signal?: AbortSignal) {
  return api.get<PropellantDto[]>('/api/propellants', { signal });
}

export function propellantsQueryOptions() {
  return queryOptions({ queryKey: propellantKeys.list(), queryFn: ({ signal }) => fetchPropellants(signal), staleTime: 5 * 60_000 });
}

export function usePropellants() {
  return useQuery(propellantsQueryOptions());
}
