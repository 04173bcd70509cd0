import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RiskMatrixDto } from '../../../contract/hazards';
import { api } from '../../../lib/api';
import { anomalyKeys } from './keys';

export interface SeverityScale {
  matrixId: string;
  matrixName: string;
  severities: { key: string; label: string; description?: string }[];
}

/** The severity categories of the team's default risk matrix: the scale a new anomaly is rated on. */
export async function fetchSeverityScale(signal?: AbortSignal): Promise<SeverityScale> {
  const matrices = await api.get<RiskMatrixDto[]>('/api/risk-matrices', { signal });
  const m = matrices.find((x) => x.isDefault && !x.retired) ?? matrices.find((x) => x.builtIn) ?? matrices[0]!;
  return { matrixId: m.id, matrixName: m.name, severities: m.severities.map((s) => ({ key: s.key, label: s.label, description: s.description })) };
}

export function severityScaleQueryOptions() {
  return queryOptions({ queryKey: anomalyKeys.choices('matrices'), queryFn: ({ signal }) => fetchSeverityScale(signal) });
}

export function useSeverityScale() {
  return useQuery(severityScaleQueryOptions());
}
