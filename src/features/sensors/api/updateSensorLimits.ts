import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SensorDatasetDto, SensorLimitsPatch } from '../../../contract/sensors';
import { api } from '../../../lib/api';
import { sensorKeys } from './keys';

export interface UpdateSensorLimitsInput {
  countId: number;
  datasetId: number;
  patch: SensorLimitsPatch;
}

export function updateSensorLimits({ countId, datasetId, patch }: UpdateSensorLimitsInput) {
  return api.patch<SensorDatasetDto>(`/api/counts/${countId}/sensors/${datasetId}`, patch);
}

export function useUpdateSensorLimits() {
  const client = useQueryClient();
  // The summaries (limit crossings) come with the data, so both are refetched.
  return useMutation({ mutationFn: updateSensorLimits, onSuccess: (d) => client.invalidateQueries({ queryKey: sensorKeys.count(d.countId) }) });
}
