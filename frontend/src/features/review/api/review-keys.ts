export const reviewKeys = {
  all: ['review'] as const,
  queue: () => [...reviewKeys.all, 'queue'] as const,
  proxies: (datasetId: string) => [...reviewKeys.all, 'proxies', datasetId] as const,
  approval: (datasetId: string) => [...reviewKeys.all, 'approval', datasetId] as const,
};
