import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProcedureSummaryDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { countKeys } from './keys';

/** The procedures a new count may be made from (the form shows which have a released revision). */
export function fetchCountableProcedures(signal?: AbortSignal) {
  return api.get<ProcedureSummaryDto[]>('/api/procedures', { signal });
}

export function countableProceduresQueryOptions() {
  return queryOptions({ queryKey: countKeys.procedures(), queryFn: ({ signal }) => fetchCountableProcedures(signal) });
}

export function useCountableProcedures(enabled = true) {
  return useQuery({ ...countableProceduresQueryOptions(), enabled });
}
