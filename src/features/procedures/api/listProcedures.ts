import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureSummaryDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

export function fetchProcedures(signal?: AbortSignal) {
  return api.get<ProcedureSummaryDto[]>('/api/procedures', { signal });
}

export function proceduresQueryOptions() {
  return queryOptions({ queryKey: procedureKeys.lists(), queryFn: ({ signal }) => fetchProcedures(signal) });
}

export function useProcedures() {
  return useQuery(proceduresQueryOptions());
}
