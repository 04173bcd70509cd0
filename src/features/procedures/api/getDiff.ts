import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DiffDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export function fetchDiff(id: number, from: number, to: number, signal?: AbortSignal) {
  return api.get<DiffDto>(`/api/procedures/${id}/diff?from=${from}&to=${to}`, { signal });
}

export function diffQueryOptions(id: number, from: number, to: number) {
  return queryOptions({ queryKey: procedureKeys.diff(id, from, to), queryFn: ({ signal }) => fetchDiff(id, from, to, signal) });
}

export function useDiff(id: number, from: number | null, to: number | null) {
  return useQuery({ ...diffQueryOptions(id, from ?? 0, to ?? 0), enabled: from !== null && to !== null });
}
