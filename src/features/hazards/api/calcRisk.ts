import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { riskCalcQuerySchema, type RiskCalcResult } from '../../../contract/hazards';
import { getCalc } from './calcRequest';
import { calcKeys } from './keys';

export { riskCalcQuerySchema };
export type RiskCalcInput = z.input<typeof riskCalcQuerySchema>;

export function fetchRiskCalc(inputs: RiskCalcInput, signal?: AbortSignal) {
  return getCalc<RiskCalcResult>('risk', inputs, signal);
}

/** Disabled until the form has been sent once (inputs not null). */
export function riskCalcQueryOptions(inputs: RiskCalcInput | null) {
  return queryOptions({
    queryKey: calcKeys.one('risk', inputs ?? {}),
    queryFn: ({ signal }) => fetchRiskCalc(inputs as RiskCalcInput, signal),
    enabled: inputs !== null,
    staleTime: Infinity,
  });
}

export function useRiskCalc(inputs: RiskCalcInput | null) {
  return useQuery(riskCalcQueryOptions(inputs));
}
