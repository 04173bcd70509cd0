import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AnomalyPersonDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

/** The team's active people, for choosing who owns a corrective action. */
export function fetchAnomalyPeople(signal?: AbortSignal) {
  return api.get<AnomalyPersonDto[]>('/api/anomalies/people', { signal });
}

export function anomalyPeopleQueryOptions() {
  return queryOptions({ queryKey: anomalyKeys.people(), queryFn: ({ signal }) => fetchAnomalyPeople(signal) });
}

export function useAnomalyPeople() {
  return useQuery(anomalyPeopleQueryOptions());
}
