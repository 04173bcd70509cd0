import { useMutation, useQueryClient } from '@tanstack/react-query';
import { riskMatrixUpdateInputSchema, type RiskMatrixDto, type RiskMatrixUpdateInput } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { matrixKeys } from './keys';

export { riskMatrixUpdateInputSchema, type RiskMatrixUpdateInput };

/** Replaces a team matrix; the server refuses (409) once any hazard has been assessed with it. */
export function updateRiskMatrix({ id, input }: { id: string; input: RiskMatrixUpdateInput }) {
  return api.put<RiskMatrixDto>(`/api/risk-matrices/${encodeURIComponent(id)}`, input);
}

export function useUpdateRiskMatrix() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: updateRiskMatrix,
    onSuccess: (matrix) => {
      client.setQueryData(matrixKeys.detail(matrix.id), matrix);
      void client.invalidateQueries({ queryKey: matrixKeys.all });
    },
  });
}
