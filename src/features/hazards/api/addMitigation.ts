import { useMutation, useQueryClient } from '@tanstack/react-query';
import { mitigationInputSchema, type HazardDto, type MitigationInput } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { mitigationInputSchema, type MitigationInput };

export function addMitigation({ hazardId, input }: { hazardId: number; input: MitigationInput }) {
  return api.post<HazardDto>(`/api/hazards/${hazardId}/mitigations`, input);
}

export function useAddMitigation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: addMitigation,
    onSuccess: (hazard) => {
      // The server answers with the whole hazard: show it at once, refresh lists and history behind it.
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
