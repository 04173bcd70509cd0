import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';


/** Closes the anomaly (safety officer; refused while a corrective action is not done). */
export function closeAnomaly(input: { id: number; note?: string }) {
  return api.post<AnomalyDto>(`/api/anomalies/${input.id}/close`, { note: input.note ?? "" });
}

export function useCloseAnomaly() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: closeAnomaly,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
