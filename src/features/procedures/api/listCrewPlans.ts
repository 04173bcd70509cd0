import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CrewPlanDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { crewPlanKeys } from './keys';

export function fetchCrewPlans(signal?: AbortSignal) {
  return api.get<CrewPlanDto[]>('/api/crew-plans', { signal });
}

export function crewPlansQueryOptions() {
  return queryOptions({ queryKey: crewPlanKeys.list(), queryFn: ({ signal }) => fetchCrewPlans(signal) });
}

export function useCrewPlans() {
  return useQuery(crewPlansQueryOptions());
}
