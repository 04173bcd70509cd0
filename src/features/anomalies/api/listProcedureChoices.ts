import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureSummaryDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

/** The team's procedures, to open a lessons-learned draft of one. */
export function fetchProcedureChoices(signal?: AbortSignal) {
  return api.get<ProcedureSummaryDto[]>('/api/procedures', { signal });
}

export function procedureChoicesQueryOptions() {
  return queryOptions({ queryKey: anomalyKeys.choices('procedures'), queryFn: ({ signal }) => fetchProcedureChoices(signal) });
}

export function useProcedureChoices() {
  return useQuery(procedureChoicesQueryOptions());
}
