import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetSummary } from '../../../../../shared/datasets';
import { api } from '../../../lib/api-client';
import { datasetKeys } from './dataset-keys';

export function getDatasets(): Promise<DatasetSummary[]> {
  return api.get<DatasetSummary[]>('/api/datasets');
}

export const datasetsQueryOptions = () =>
  queryOptions({ queryKey: datasetKeys.list(), queryFn: getDatasets });

export function useDatasets() {
  return useQuery(datasetsQueryOptions());
}
