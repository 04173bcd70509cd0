import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

export interface HazardChoice {
  id: number;
  code: string;
  title: string;
}

/** The register's hazards, to link one to an anomaly. */
export async function fetchHazardChoices(signal?: AbortSignal): Promise<HazardChoice[]> {
  const list = await api.get<HazardDto[]>('/api/hazards', { signal });
  return list.map((h) => ({ id: h.id, code: h.code, title: h.title }));
}

export function hazardChoicesQueryOptions() {
  return queryOptions({ queryKey: anomalyKeys.choices('hazards'), queryFn: ({ signal }) => fetchHazardChoices(signal) });
}

export function useHazardChoices() {
  return useQuery(hazardChoicesQueryOptions());
}
