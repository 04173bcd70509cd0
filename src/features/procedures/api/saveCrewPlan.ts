import { useMutation, useQueryClient } from '@tanstack/react-query';
import { crewPlanInputSchema, type CrewPlanDto, type CrewPlanInput } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { crewPlanKeys } from './keys';

export { crewPlanInputSchema, type CrewPlanInput };

/** Creates a plan (no id) or replaces one whole (PUT), assignments included. */
export function saveCrewPlan({ id, input }: { id?: number; input: CrewPlanInput }) {
  return id === undefined ? api.post<CrewPlanDto>('/api/crew-plans', input) : api.put<CrewPlanDto>(`/api/crew-plans/${id}`, input);
}

export function useSaveCrewPlan() {
  const client = useQueryClient();
  return useMutation({ mutationFn: saveCrewPlan, onSuccess: () => void client.invalidateQueries({ queryKey: crewPlanKeys.all }) });
}
