import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';
import type { AnomalyUpdateInput } from '../../../contract/anomalies';

/** Corrects the title, description, severity or immediate actions of an open anomaly. */
export function updateAnomaly(input: { id: number } & AnomalyUpdateInput) {
  return api.patch<AnomalyDto>(`/api/anomalies/${input.id}`, { ...input, id: undefined });
}

export function useUpdateAnomaly() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateAnomaly,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
