import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelRunSummary } from '../../../../../shared/models';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export function getModels(params: { datasetId?: string } = {}): Promise<ModelRunSummary[]> {
  const query = params.datasetId ? `?datasetId=${encodeURIComponent(params.datasetId)}` : '';
  return api.get(`/api/models${query}`);
}

const isActive = (runs: ModelRunSummary[] | undefined) =>
  runs?.some((r) => r.status === 'queued' || r.status === 'running') ?? false;

export const modelsQueryOptions = (params: { datasetId?: string } = {}) =>
  queryOptions({
    queryKey: modelKeys.list(params),
    queryFn: () => getModels(params),
    // Keep polling while a run in the list trains.
    refetchInterval: (query) => (isActive(query.state.data) ? 1500 : false),
  });

export function useModels(params: { datasetId?: string } = {}) {
  return useQuery(modelsQueryOptions(params));
}
