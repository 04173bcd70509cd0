import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { stationKeys } from './keys';

export function deleteStation(id: number) {
  return api.delete(`/api/stations/${id}`);
}

export function useDeleteStation() {
  const client = useQueryClient();
  return useMutation({ mutationFn: deleteStation, onSuccess: () => void client.invalidateQueries({ queryKey: stationKeys.all }) });
}
