import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HazardCreateInput, HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

/** Adds the hazard and links it to the anomaly it was raised from, in one step on the server. */
export function createHazardFromAnomaly({ anomalyId, input }: { anomalyId: number; input: HazardCreateInput }) {
  return api.post<HazardDto>(`/api/anomalies/${anomalyId}/hazards/new`, input);
}

export function useCreateHazardFromAnomaly() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createHazardFromAnomaly,
    onSuccess: (hazard, { anomalyId }) => {
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.lists() });
      void client.invalidateQueries({ queryKey: ['anomalies', 'detail', anomalyId] });
      void client.invalidateQueries({ queryKey: ['anomalies', 'list'] });
    },
  });
}
