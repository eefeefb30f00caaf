import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelRunDetail } from '../../../../../shared/models';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export function getModel(id: string): Promise<ModelRunDetail> {
  return api.get(`/api/models/${encodeURIComponent(id)}`);
}

export const modelQueryOptions = (id: string) =>
  queryOptions({
    queryKey: modelKeys.detail(id),
    queryFn: () => getModel(id),
    // Progress is polled while the run is queued or training.
    refetchInterval: (query) => {
      const status = query.state.data?.status;
      return status === 'queued' || status === 'running' ? 1000 : false;
    },
  });

export function useModel(id: string) {
  return useQuery(modelQueryOptions(id));
}
