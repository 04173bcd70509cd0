import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { countKeys } from './keys';

/** One procedure with its revisions, so the form can offer the latest released one and say why not the others. */
export function fetchProcedureRevisions(id: number, signal?: AbortSignal) {
  return api.get<ProcedureDto>(`/api/procedures/${id}`, { signal });
}

export function procedureRevisionsQueryOptions(id: number) {
  return queryOptions({ queryKey: countKeys.procedure(id), queryFn: ({ signal }) => fetchProcedureRevisions(id, signal) });
}

export function useProcedureRevisions(id: number | null) {
  return useQuery({ ...procedureRevisionsQueryOptions(id ?? 0), enabled: id !== null });
}
