import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';
import type { CorrectiveActionInput } from '../../../contract/anomalies';

/** Adds a corrective action; the server e-mails its owner. */
export function addCorrectiveAction(input: { id: number } & CorrectiveActionInput) {
  return api.post<AnomalyDto>(`/api/anomalies/${input.id}/actions`, { description: input.description, ownerId: input.ownerId, dueDate: input.dueDate, status: input.status });
}

export function useAddCorrectiveAction() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: addCorrectiveAction,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
