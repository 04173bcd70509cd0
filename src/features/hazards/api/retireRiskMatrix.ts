import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RiskMatrixDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { matrixKeys } from './keys';

export function retireRiskMatrix(id: string) {
  return api.post<RiskMatrixDto>(`/api/risk-matrices/${encodeURIComponent(id)}/retire`);
}

export function useRetireRiskMatrix() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: retireRiskMatrix,
    onSuccess: (matrix) => {
      client.setQueryData(matrixKeys.detail(matrix.id), matrix);
      // Retiring can also end a default, so every matrix may have changed.
      void client.invalidateQueries({ queryKey: matrixKeys.all });
    },
  });
}
