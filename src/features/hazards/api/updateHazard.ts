import { useMutation, useQueryClient } from '@tanstack/react-query';
import { hazardUpdateInputSchema, type HazardDto, type HazardUpdateInput } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { hazardUpdateInputSchema, type HazardUpdateInput };

export function updateHazard({ id, input }: { id: number; input: HazardUpdateInput }) {
  return api.patch<HazardDto>(`/api/hazards/${id}`, input);
}

export function useUpdateHazard() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateHazard,
    onSuccess: (hazard) => {
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.all });
    },
  });
}
