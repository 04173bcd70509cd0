import { useMutation, useQueryClient } from '@tanstack/react-query';
import { hazardCreateInputSchema, type HazardCreateInput, type HazardDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { hazardKeys } from './keys';

export { hazardCreateInputSchema, type HazardCreateInput };

export function createHazard(input: HazardCreateInput) {
  return api.post<HazardDto>('/api/hazards', input);
}

export function useCreateHazard() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createHazard,
    onSuccess: (hazard) => {
      client.setQueryData(hazardKeys.detail(hazard.id), hazard);
      void client.invalidateQueries({ queryKey: hazardKeys.lists() });
    },
  });
}
