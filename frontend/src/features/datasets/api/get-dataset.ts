import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetDetail } from '../../../../../shared/datasets';
import { api } from '../../../lib/api-client';
import { datasetKeys } from './dataset-keys';

export function getDataset(id: string): Promise<DatasetDetail> {
  return api.get<DatasetDetail>(`/api/datasets/${encodeURIComponent(id)}`);
}

export const datasetQueryOptions = (id: string) =>
  queryOptions({ queryKey: datasetKeys.detail(id), queryFn: () => getDataset(id) });

export function useDataset(id: string) {
  return useQuery(datasetQueryOptions(id));
}
