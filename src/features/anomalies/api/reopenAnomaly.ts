import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';


/** Reopens a closed anomaly (safety officer). */
export function reopenAnomaly(input: { id: number; note?: string }) {
  return api.post<AnomalyDto>(`/api/anomalies/${input.id}/reopen`, { note: input.note ?? "" });
}

export function useReopenAnomaly() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: reopenAnomaly,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
