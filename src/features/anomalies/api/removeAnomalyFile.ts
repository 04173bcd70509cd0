import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

export function removeAnomalyFile({ id, attachmentId }: { id: number; attachmentId: number }) {
  return api.delete<AnomalyDto>(`/api/anomalies/${id}/attachments/${attachmentId}`);
}

export function useRemoveAnomalyFile() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: removeAnomalyFile,
    onSuccess: (anomaly) => client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly),
  });
}
