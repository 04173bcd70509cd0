import { useMutation, useQueryClient } from '@tanstack/react-query';
import { statusChangeInputSchema, type HazardDto, type StatusChangeInput } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { statusChangeInputSchema, type StatusChangeInput };

export function changeHazardStatus({ id, input }: { id: number; input: StatusChangeInput }) {
  return api.post<HazardDto>(`/api/hazards/${id}/status`, input);
}

export function useChangeHazardStatus() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: changeHazardStatus,
    onSuccess: (hazard) => {
      // The server answers with the whole hazard: show it at once, refresh lists and history behind it.
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
