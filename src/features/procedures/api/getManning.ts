import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ManningDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { crewPlanKeys } from './keys';

export function fetchManning(planId: number, procedureId: number, revision?: number, signal?: AbortSignal) {
  const query = new URLSearchParams({ procedureId: String(procedureId) });
  if (revision !== undefined) query.set('revision', String(revision));
  return api.get<ManningDto>(`/api/crew-plans/${planId}/manning?${query.toString()}`, { signal });
}

export function manningQueryOptions(planId: number, procedureId: number, revision?: number) {
  return queryOptions({
    queryKey: crewPlanKeys.manning(planId, procedureId, revision),
    queryFn: ({ signal }) => fetchManning(planId, procedureId, revision, signal),
  });
}

export function useManning(planId: number, procedureId: number, revision?: number) {
  return useQuery(manningQueryOptions(planId, procedureId, revision));
}
