import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export function removeEvidence({ hazardId, evidenceId }: { hazardId: number; evidenceId: number }) {
  return api.delete<HazardDto>(`/api/hazards/${hazardId}/evidence/${evidenceId}`);
}

export function useRemoveEvidence() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: removeEvidence,
    onSuccess: (hazard) => {
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
