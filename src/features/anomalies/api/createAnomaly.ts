import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyCreateInput, AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

export function createAnomaly(input: AnomalyCreateInput) {
  return api.post<AnomalyDto>('/api/anomalies', input);
}

export function useCreateAnomaly() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createAnomaly,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
