import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FeatureOptions } from '../../../../../shared/models';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export function getFeatureOptions(datasetId: string): Promise<FeatureOptions> {
  return api.get(`/api/models/feature-options?datasetId=${encodeURIComponent(datasetId)}`);
}

export const featureOptionsQueryOptions = (datasetId: string) =>
  queryOptions({
    queryKey: modelKeys.featureOptions(datasetId),
    queryFn: () => getFeatureOptions(datasetId),
    enabled: datasetId !== '',
  });

export function useFeatureOptions(datasetId: string) {
  return useQuery(featureOptionsQueryOptions(datasetId));
}
