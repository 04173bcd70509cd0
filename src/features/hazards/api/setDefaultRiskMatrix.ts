import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RiskMatrixDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { matrixKeys } from './keys';

/** Makes this matrix the one new hazards use unless another is chosen (the built-in id restores it). */
export function setDefaultRiskMatrix(id: string) {
  return api.post<RiskMatrixDto>(`/api/risk-matrices/${encodeURIComponent(id)}/default`);
}

export function useSetDefaultRiskMatrix() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: setDefaultRiskMatrix,
    onSuccess: () => void client.invalidateQueries({ queryKey: matrixKeys.all }),
  });
}
