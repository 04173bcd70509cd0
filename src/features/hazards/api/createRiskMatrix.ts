import { useMutation, useQueryClient } from '@tanstack/react-query';
import { riskMatrixInputSchema, type RiskMatrixDto, type RiskMatrixInput } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { matrixKeys } from './keys';

export { riskMatrixInputSchema, type RiskMatrixInput };

export function createRiskMatrix(input: RiskMatrixInput) {
  return api.post<RiskMatrixDto>('/api/risk-matrices', input);
}

export function useCreateRiskMatrix() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: createRiskMatrix,
    onSuccess: (matrix) => {
      client.setQueryData(matrixKeys.detail(matrix.id), matrix);
      void client.invalidateQueries({ queryKey: matrixKeys.list() });
    },
  });
}
