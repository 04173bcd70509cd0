import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SensorListDto } from '../../../contract/sensors';
import { api } from '../../../lib/api';
import { sensorKeys } from './keys';

export function listSensorData(countId: number, signal?: AbortSignal) {
  return api.get<SensorListDto>(`/api/counts/${countId}/sensors`, { signal });
}

export function sensorListQueryOptions(countId: number) {
  return queryOptions({ queryKey: sensorKeys.list(countId), queryFn: ({ signal }) => listSensorData(countId, signal) });
}

export function useSensorList(countId: number) {
  return useQuery(sensorListQueryOptions(countId));
}
