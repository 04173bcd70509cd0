import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CountDetailDto } from '../../../contract/count';
import { api } from '../../../lib/api';
import { countKeys } from './keys';

export function fetchCount(id: number, signal?: AbortSignal) {
  return api.get<CountDetailDto>(`/api/counts/${id}`, { signal });
}

/** The count as the server had it when asked; the live state then comes from the socket. */
export function countQueryOptions(id: number) {
  return queryOptions({ queryKey: countKeys.detail(id), queryFn: ({ signal }) => fetchCount(id, signal), staleTime: Infinity });
}

export function useCount(id: number) {
  return useQuery(countQueryOptions(id));
}
