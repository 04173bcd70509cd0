import { api } from '../../../lib/api';

/** GET /api/calc/<name>?<inputs>: the calculators take their inputs as a query string. */
export function getCalc<T>(name: string, inputs: Record<string, unknown>, signal?: AbortSignal): Promise<T> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(inputs)) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  return api.get<T>(`/api/calc/${name}?${params.toString()}`, { signal });
}
