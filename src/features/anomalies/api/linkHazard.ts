import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';


/** Links a hazard of the register to the anomaly. */
export function linkHazard(input: { id: number; hazardId: number }) {
  return api.post<AnomalyDto>(`/api/anomalies/${input.id}/hazards`, { hazardId: input.hazardId });
}

export function useLinkHazard() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: linkHazard,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
