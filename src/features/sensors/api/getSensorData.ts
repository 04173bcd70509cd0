import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SensorDataDto } from '../../../contract/sensors';
import { api } from '../../../lib/api';
import { sensorKeys } from './keys';

/** The readings, thinned on the server to at most `maxPoints` rows (min and max per bucket, so peaks stay). */
export function getSensorData(countId: number, datasetId: number, maxPoints: number, signal?: AbortSignal) {
  return api.get<SensorDataDto>(`/api/counts/${countId}/sensors/${datasetId}/data?maxPoints=${maxPoints}`, { signal });
}

export function sensorDataQueryOptions(countId: number, datasetId: number, maxPoints: number) {
  return queryOptions({
    queryKey: sensorKeys.data(countId, datasetId, maxPoints),
    queryFn: ({ signal }) => getSensorData(countId, datasetId, maxPoints, signal),
    staleTime: 5 * 60_000,
  });
}

export function useSensorData(countId: number, datasetId: number | null, maxPoints: number) {
  return useQuery({ ...sensorDataQueryOptions(countId, datasetId ?? 0, maxPoints), enabled: datasetId !== null });
}
