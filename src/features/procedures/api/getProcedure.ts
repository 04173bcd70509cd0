import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export function fetchProcedure(id: number, signal?: AbortSignal) {
  return api.get<ProcedureDto>(`/api/procedures/${id}`, { signal });
}

export function procedureQueryOptions(id: number) {
  return queryOptions({ queryKey: procedureKeys.detail(id), queryFn: ({ signal }) => fetchProcedure(id, signal) });
}

export function useProcedure(id: number) {
  return useQuery(procedureQueryOptions(id));
}
