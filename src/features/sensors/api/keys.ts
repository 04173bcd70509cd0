/** ['sensors', countId] refreshes a count's datasets and their data; ['sensors', countId, 'data', datasetId, …] one plot. */
export const sensorKeys = {
  all: ['sensors'] as const,
  count: (countId: number) => ['sensors', countId] as const,
  list: (countId: number) => ['sensors', countId, 'list'] as const,
  data: (countId: number, datasetId: number, maxPoints: number, window: SensorWindow | null = null) =>
    ['sensors', countId, 'data', datasetId, maxPoints, window ? `${window.from}..${window.to}` : 'all'] as const,
};

/** A stretch of the time axis, seconds from T-0, as text the server accepts (at most six decimals). */
export interface SensorWindow {
  from: string;
  to: string;
}
