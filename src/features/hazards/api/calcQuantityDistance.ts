import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { quantityDistanceQuerySchema, type QuantityDistanceCalcResult } from '../../../contract/hazards';
import { getCalc } from './calcRequest';
import { calcKeys } from './keys';

export { quantityDistanceQuerySchema };
export type QuantityDistanceCalcInput = z.input<typeof quantityDistanceQuerySchema>;

export function fetchQuantityDistanceCalc(inputs: QuantityDistanceCalcInput, signal?: AbortSignal) {
  return getCalc<QuantityDistanceCalcResult>('quantity-distance', inputs, signal);
}

/** Disabled until the form has been sent once (inputs not null). */
export function quantityDistanceCalcQueryOptions(inputs: QuantityDistanceCalcInput | null) {
  return queryOptions({
    queryKey: calcKeys.one('quantity-distance', inputs ?? {}),
    queryFn: ({ signal }) => fetchQuantityDistanceCalc(inputs as QuantityDistanceCalcInput, signal),
    enabled: inputs !== null,
    staleTime: Infinity,
  });
}

export function useQuantityDistanceCalc(inputs: QuantityDistanceCalcInput | null) {
  return useQuery(quantityDistanceCalcQueryOptions(inputs));
}
