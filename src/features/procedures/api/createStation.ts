import { useMutation, useQueryClient } from '@tanstack/react-query';
import { stationInputSchema, type StationDto, type StationInput } from '../../../contract/procedures';
import { api } from '../../../lib/api';
import { stationKeys } from './keys';

export { stationInputSchema, type StationInput };

export function createStation(input: StationInput) {
  return api.post<StationDto>('/api/stations', input);
}

export function useCreateStation() {
  const client = useQueryClient();
  return useMutation({ mutationFn: createStation, onSuccess: () => void client.invalidateQueries({ queryKey: stationKeys.all }) });
}
