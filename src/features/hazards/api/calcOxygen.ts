import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { oxygenQuerySchema, type OxygenCalcResult } from '../../../contract/hazards';
import { getCalc } from './calcRequest';
import { calcKeys } from './keys';

export { oxygenQuerySchema };
export type OxygenCalcInput = z.input<typeof oxygenQuerySchema>;

export function fetchOxygenCalc(inputs: OxygenCalcInput, signal?: AbortSignal) {
  return getCalc<OxygenCalcResult>('oxygen', inputs, signal);
}

/** Disabled until the form has been sent once (inputs not null). */
export function oxygenCalcQueryOptions(inputs: OxygenCalcInput | null) {
  return queryOptions({
    queryKey: calcKeys.one('oxygen', inputs ?? {}),
    queryFn: ({ signal }) => fetchOxygenCalc(inputs as OxygenCalcInput, signal),
    enabled: inputs !== null,
    staleTime: Infinity,
  });
}

export function useOxygenCalc(inputs: OxygenCalcInput | null) {
  return useQuery(oxygenCalcQueryOptions(inputs));
}
