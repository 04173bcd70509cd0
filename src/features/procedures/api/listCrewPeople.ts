import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CrewPersonDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { crewPlanKeys } from './keys';

/** The team's active people, for whoever writes crew plans (admin, conductor). */
export function fetchCrewPeople(signal?: AbortSignal) {
  return api.get<CrewPersonDto[]>('/api/crew-plans/people', { signal });
}

export function crewPeopleQueryOptions() {
  return queryOptions({ queryKey: crewPlanKeys.people(), queryFn: ({ signal }) => fetchCrewPeople(signal) });
}

export function useCrewPeople(options: { enabled?: boolean } = {}) {
  return useQuery({ ...crewPeopleQueryOptions(), enabled: options.enabled ?? true });
}
