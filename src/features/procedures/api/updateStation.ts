import { useMutation, useQueryClient } from '@tanstack/react-query';
import { stationUpdateInputSchema, type StationDto, type StationUpdateInput } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { crewPlanKeys, stationKeys } from './keys';

export { stationUpdateInputSchema, type StationUpdateInput };

export function updateStation({ id, input }: { id: number; input: StationUpdateInput }) {
  return api.patch<StationDto>(`/api/stations/${id}`, input);
}

export function useUpdateStation() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateStation,
    onSuccess: () => {
      void client.invalidateQueries({ queryKey: stationKeys.all });
      // Crew plans show station names.
      void client.invalidateQueries({ queryKey: crewPlanKeys.all });
    },
  });
}
