import { queryOptions, useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import type { RiskMatrixDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { matrixCatalogue } from '../lib/risk';
import { matrixKeys } from './keys';

export function fetchRiskMatrices(signal?: AbortSignal) {
  return api.get<RiskMatrixDto[]>('/api/risk-matrices', { signal });
}

export function riskMatricesQueryOptions() {
  return queryOptions({ queryKey: matrixKeys.list(), queryFn: ({ signal }) => fetchRiskMatrices(signal) });
}

/** The built-in matrix first, then the team's. `enabled: false` skips the request (built-in only needed). */
export function useRiskMatrices({ enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...riskMatricesQueryOptions(), enabled });
}

/**
 * Matrices by id for drawing hazards. The built-in matrix is always there; the team's come with the request,
 * which is only made when `needed` (some hazard uses a team matrix), so built-in-only screens stay one request.
 */
export function useMatrixCatalogue(needed: boolean) {
  const query = useRiskMatrices({ enabled: needed });
  const catalogue = useMemo(() => matrixCatalogue(query.data), [query.data]);
  return { catalogue, query };
}
