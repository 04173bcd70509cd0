import { useMutation, useQueryClient } from '@tanstack/react-query';
import { acceptanceInputSchema, type AcceptanceInput, type HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { acceptanceInputSchema, type AcceptanceInput };

export function acceptHazard({ id, input }: { id: number; input: AcceptanceInput }) {
  return api.post<HazardDto>(`/api/hazards/${id}/acceptances`, input);
}

export function useAcceptHazard() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: acceptHazard,
    onSuccess: (hazard) => {
      // The server answers with the whole hazard: show it at once, refresh lists and history behind it.
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
