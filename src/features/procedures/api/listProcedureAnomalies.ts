import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnomalySummaryDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';

/** The anomalies that opened or were linked to a revision of this procedure (lessons learned). */
export function fetchProcedureAnomalies(procedureId: number, signal?: AbortSignal) {
  return api.get<AnomalySummaryDto[]>(`/api/anomalies?procedureId=${procedureId}`, { signal });
}

export function procedureAnomaliesQueryOptions(procedureId: number) {
  return queryOptions({
    queryKey: ['anomalies', 'list', { procedureId: String(procedureId) }] as const,
    queryFn: ({ signal }) => fetchProcedureAnomalies(procedureId, signal),
  });
}

export function useProcedureAnomalies(procedureId: number) {
  return useQuery(procedureAnomaliesQueryOptions(procedureId));
}
