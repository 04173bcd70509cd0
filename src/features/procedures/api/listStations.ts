import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StationDto } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { stationKeys } from './keys';

export function fetchStations(signal?: AbortSignal) {
  return api.get<StationDto[]>('/api/stations', { signal });
}

export function stationsQueryOptions() {
  return queryOptions({ queryKey: stationKeys.list(), queryFn: ({ signal }) => fetchStations(signal) });
}

export function useStations() {
  return useQuery(stationsQueryOptions());
}
