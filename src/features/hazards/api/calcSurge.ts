import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { surgeQuerySchema, type SurgeCalcResult } from '../../../contract/hazards';
import { getCalc } from './calcRequest';
import { calcKeys } from './keys';

export { surgeQuerySchema };
export type SurgeCalcInput = z.input<typeof surgeQuerySchema>;

export function fetchSurgeCalc(inputs: SurgeCalcInput, signal?: AbortSignal) {
  return getCalc<SurgeCalcResult>('surge', inputs, signal);
}

/** Disabled until the form has been sent once (inputs not null). */
export function surgeCalcQueryOptions(inputs: SurgeCalcInput | null) {
  return queryOptions({
    queryKey: calcKeys.one('surge', inputs ?? {}),
    queryFn: ({ signal }) => fetchSurgeCalc(inputs as SurgeCalcInput, signal),
    enabled: inputs !== null,
    staleTime: Infinity,
  });
}

export function useSurgeCalc(inputs: SurgeCalcInput | null) {
  return useQuery(surgeCalcQueryOptions(inputs));
}
