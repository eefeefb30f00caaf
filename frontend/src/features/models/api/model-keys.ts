export const modelKeys = {
  all: ['models'] as const,
  list: (params: { datasetId?: string } = {}) => [...modelKeys.all, 'list', params] as const,
  detail: (id: string) => [...modelKeys.all, 'detail', id] as const,
  featureOptions: (datasetId: string) => [...modelKeys.all, 'feature-options', datasetId] as const,
  datasets: () => [...modelKeys.all, 'datasets'] as const,
};
