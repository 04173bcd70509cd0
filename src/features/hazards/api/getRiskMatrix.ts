import { queryOptions, useQuery } from '@tanstack/react-query';
import { matrixIdSchema, type RiskMatrixDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { matrixKeys } from './keys';

export { matrixIdSchema };

export function fetchRiskMatrix(id: string, signal?: AbortSignal) {
  return api.get<RiskMatrixDto>(`/api/risk-matrices/${encodeURIComponent(id)}`, { signal });
}

export function riskMatrixQueryOptions(id: string) {
  return queryOptions({ queryKey: matrixKeys.detail(id), queryFn: ({ signal }) => fetchRiskMatrix(id, signal) });
}

export function useRiskMatrix(id: string) {
  return useQuery(riskMatrixQueryOptions(id));
}
