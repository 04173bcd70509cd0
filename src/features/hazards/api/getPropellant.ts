import { queryOptions, useQuery } from '@tanstack/react-query';
import { propellantParamSchema, type PropellantDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { propellantKeys } from './keys';

export { propellantParamSchema };

export function fetchPropellant(id: string, signal?: AbortSignal) {
  return api.get<PropellantDto>(`/api/propellants/${encodeURIComponent(id)}`, { signal });
}

export function propellantQueryOptions(id: string) {
  return queryOptions({ queryKey: propellantKeys.detail(id), queryFn: ({ signal }) => fetchPropellant(id, signal), staleTime: 5 * 60_000 });
}

export function usePropellant(id: string) {
  return useQuery(propellantQueryOptions(id));
}
