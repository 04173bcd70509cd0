import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { crewPlanKeys } from './keys';

export function deleteCrewPlan(id: number) {
  return api.delete(`/api/crew-plans/${id}`);
}

export function useDeleteCrewPlan() {
  const client = useQueryClient();
  return useMutation({ mutationFn: deleteCrewPlan, onSuccess: () => void client.invalidateQueries({ queryKey: crewPlanKeys.all }) });
}
