import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export function removeMitigation({ hazardId, id }: { hazardId: number; id: number }) {
  return api.delete<HazardDto>(`/api/hazards/${hazardId}/mitigations/${id}`);
}

export function useRemoveMitigation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: removeMitigation,
    onSuccess: (hazard) => {
      // The server answers with the whole hazard: show it at once, refresh lists and history behind it.
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
