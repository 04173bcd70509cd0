import { useMutation, useQueryClient } from '@tanstack/react-query';
import { mitigationUpdateInputSchema, type HazardDto, type MitigationUpdateInput } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { mitigationUpdateInputSchema, type MitigationUpdateInput };

export function updateMitigation({ hazardId, id, input }: { hazardId: number; id: number; input: MitigationUpdateInput }) {
  return api.patch<HazardDto>(`/api/hazards/${hazardId}/mitigations/${id}`, input);
}

export function useUpdateMitigation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateMitigation,
    onSuccess: (hazard) => {
      // The server answers with the whole hazard: show it at once, refresh lists and history behind it.
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
