import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ChannelLimitsInput, SensorDatasetDto } from '../../../contract/sensors';
import { api } from '../../../lib/api';
import { sensorKeys } from './keys';

export interface UploadSensorDataInput {
  countId: number;
  file: File;
  /** Limits by channel name, sent as the JSON text of the field `limits`. */
  limits?: Record<string, ChannelLimitsInput>;
}

/** multipart/form-data: the CSV in `file`, optional `limits`. The server reads and checks every row before storing anything. */
export function uploadSensorData({ countId, file, limits }: UploadSensorDataInput) {
  const form = new FormData();
  if (limits && Object.keys(limits).length) form.append('limits', JSON.stringify(limits));
  form.append('file', file, file.name);
  return api.post<SensorDatasetDto>(`/api/counts/${countId}/sensors`, form);
}

export function useUploadSensorData() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: uploadSensorData,
    onSuccess: (d) => client.invalidateQueries({ queryKey: sensorKeys.count(d.countId) }),
  });
}
