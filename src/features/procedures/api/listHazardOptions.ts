import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { procedureKeys } from './keys';

/** The register's hazards a step can link, in code order: what the editor needs of each. */
export interface HazardOption {
  id: number;
  code: string;
  title: string;
  status: HazardDto['status'];
}

export async function fetchHazardOptions(signal?: AbortSignal): Promise<HazardOption[]> {
  const hazards = await api.get<HazardDto[]>('/api/hazards', { signal });
  return hazards
    .map(({ id, code, title, status }) => ({ id, code, title, status }))
    .sort((a, b) => a.code.localeCompare(b.code, 'en', { numeric: true }));
}

export function hazardOptionsQueryOptions() {
  return queryOptions({ queryKey: procedureKeys.hazardOptions(), queryFn: ({ signal }) => fetchHazardOptions(signal) });
}

export function useHazardOptions() {
  return useQuery(hazardOptionsQueryOptions());
}
