import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetSummary } from '../../../../../shared/datasets';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

/** The datasets a run can be trained on (the run form's choice). */
export function getDatasetsForModels(): Promise<DatasetSummary[]> {
  return api.get('/api/datasets');
}

export const datasetsForModelsQueryOptions = () =>
  queryOptions({ queryKey: modelKeys.datasets(), queryFn: getDatasetsForModels });

export function useDatasetsForModels() {
  return useQuery(datasetsForModelsQueryOptions());
}
