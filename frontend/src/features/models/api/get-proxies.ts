import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ProxyReportView } from '../../../../../shared/privacy';
import { api, isApiError } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

/** The dataset's proxy report, or null where there is none yet: the run form marks proxies with it. */
export async function getProxiesForModels(datasetId: string): Promise<ProxyReportView | null> {
  try {
    return await api.get(`/api/datasets/${encodeURIComponent(datasetId)}/proxies`);
  } catch (error) {
    if (isApiError(error) && (error.status === 404 || error.status === 409)) return null;
    throw error;
  }
}

export const proxiesForModelsQueryOptions = (datasetId: string) =>
  queryOptions({
    queryKey: [...modelKeys.featureOptions(datasetId), 'proxies'] as const,
    queryFn: () => getProxiesForModels(datasetId),
    enabled: datasetId !== '',
    retry: false,
  });

export function useProxiesForModels(datasetId: string) {
  return useQuery(proxiesForModelsQueryOptions(datasetId));
}
