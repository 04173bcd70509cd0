import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';


/** Removes the link between the anomaly and a hazard. */
export function unlinkHazard(input: { id: number; hazardId: number }) {
  return api.delete<AnomalyDto>(`/api/anomalies/${input.id}/hazards/${input.hazardId}`);
}

export function useUnlinkHazard() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: unlinkHazard,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
