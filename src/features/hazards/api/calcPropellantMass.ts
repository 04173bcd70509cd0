import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { propellantMassQuerySchema, type PropellantMassCalcResult } from '../../../contract/hazards';
import { getCalc } from './calcRequest';
import { calcKeys } from './keys';

export { propellantMassQuerySchema };
export type PropellantMassCalcInput = z.input<typeof propellantMassQuerySchema>;

export function fetchPropellantMassCalc(inputs: PropellantMassCalcInput, signal?: AbortSignal) {
  return getCalc<PropellantMassCalcResult>('propellant-mass', inputs, signal);
}

/** Disabled until the form has been sent once (inputs not null). */
export function propellantMassCalcQueryOptions(inputs: PropellantMassCalcInput | null) {
  return queryOptions({
    queryKey: calcKeys.one('propellant-mass', inputs ?? {}),
    queryFn: ({ signal }) => fetchPropellantMassCalc(inputs as PropellantMassCalcInput, signal),
    enabled: inputs !== null,
    staleTime: Infinity,
  });
}

export function usePropellantMassCalc(inputs: PropellantMassCalcInput | null) {
  return useQuery(propellantMassCalcQueryOptions(inputs));
}
