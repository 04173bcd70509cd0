import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AnomalyDto } from '../../../contract/anomalies';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';
import type { CorrectiveActionUpdateInput } from '../../../contract/anomalies';

/** Changes a corrective action (status, owner, due date, wording). */
export function updateCorrectiveAction(input: { id: number; actionId: number } & CorrectiveActionUpdateInput) {
  return api.patch<AnomalyDto>(`/api/anomalies/${input.id}/actions/${input.actionId}`, { ...input, id: undefined, actionId: undefined });
}

export function useUpdateCorrectiveAction() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateCorrectiveAction,
    onSuccess: (anomaly) => {
      client.setQueryData(anomalyKeys.detail(anomaly.id), anomaly);
      void client.invalidateQueries({ queryKey: anomalyKeys.lists() });
    },
  });
}
