import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { sensorKeys } from './keys';

export interface DeleteSensorDataInput {
  countId: number;
  datasetId: number;
}

/** Removes the dataset and its original file; the count's log is not touched. */
export function deleteSensorData({ countId, datasetId }: DeleteSensorDataInput) {
  return api.delete<void>(`/api/counts/${countId}/sensors/${datasetId}`);
}

export function useDeleteSensorData() {
  const client = useQueryClient();
  return useMutation({ mutationFn: deleteSensorData, onSuccess: (_r, v) => client.invalidateQueries({ queryKey: sensorKeys.count(v.countId) }) });
}
