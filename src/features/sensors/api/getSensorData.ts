import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SensorDataDto } from '../../../contract/sensors';
import { api } from '../../../lib/api';
import { sensorKeys, type SensorWindow } from './keys';

/**
 * The readings, thinned on the server to at most `maxPoints` rows (min and max per bucket, so peaks stay); with a
 * window, only the rows in that stretch of time, for the detail of a zoomed plot.
 */
export function getSensorData(countId: number, datasetId: number, maxPoints: number, window: SensorWindow | null, signal?: AbortSignal) {
  const range = window ? `&from=${window.from}&to=${window.to}` : '';
  return api.get<SensorDataDto>(`/api/counts/${countId}/sensors/${datasetId}/data?maxPoints=${maxPoints}${range}`, { signal });
}

export function sensorDataQueryOptions(countId: number, datasetId: number, maxPoints: number, window: SensorWindow | null = null) {
  return queryOptions({
    queryKey: sensorKeys.data(countId, datasetId, maxPoints, window),
    queryFn: ({ signal }) => getSensorData(countId, datasetId, maxPoints, window, signal),
    staleTime: 5 * 60_000,
  });
}

export function useSensorData(countId: number, datasetId: number | null, maxPoints: number) {
  return useQuery({ ...sensorDataQueryOptions(countId, datasetId ?? 0, maxPoints), enabled: datasetId !== null });
}

/** The detail for a zoomed view; the previous detail stays on screen while the next one loads. */
export function useSensorWindow(countId: number, datasetId: number, maxPoints: number, window: SensorWindow | null) {
  return useQuery({ ...sensorDataQueryOptions(countId, datasetId, maxPoints, window), enabled: window !== null, placeholderData: keepPreviousData });
}
