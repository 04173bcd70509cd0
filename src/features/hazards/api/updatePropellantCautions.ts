import { useMutation, useQueryClient } from '@tanstack/react-query';
import { propellantCautionsInputSchema, type PropellantCautionsInput, type PropellantDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { propellantKeys } from './keys';

export { propellantCautionsInputSchema, type PropellantCautionsInput };

/** Replaces the team's cautions and PPE for one propellant (safety officer only); the server keeps the history. */
export function updatePropellantCautions({ id, input }: { id: string; input: PropellantCautionsInput }) {
  return api.patch<PropellantDto>(`/api/propellants/${encodeURIComponent(id)}/cautions`, input);
}

export function useUpdatePropellantCautions() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updatePropellantCautions,
    onSuccess: (propellant) => {
      client.setQueryData(propellantKeys.detail(propellant.id), propellant);
      void client.invalidateQueries({ queryKey: propellantKeys.all });
    },
  });
}
