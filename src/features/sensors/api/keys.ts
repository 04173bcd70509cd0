/** ['sensors', countId] refreshes a count's datasets and their data; ['sensors', countId, 'data', datasetId, maxPoints] one plot. */
export const sensorKeys = {
  all: ['sensors'] as const,
  count: (countId: number) => ['sensors', countId] as const,
  list: (countId: number) => ['sensors', countId, 'list'] as const,
  data: (countId: number, datasetId: number, maxPoints: number) => ['sensors', countId, 'data', datasetId, maxPoints] as const,
};
