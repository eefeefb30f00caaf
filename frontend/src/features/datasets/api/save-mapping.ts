import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DatasetDetail, DatasetMapping } from '../../../../../shared/datasets';
import { api } from '../../../lib/api-client';
import { datasetKeys } from './dataset-keys';

export function saveMapping(id: string, mapping: DatasetMapping): Promise<DatasetDetail> {
  return api.put<DatasetDetail>(`/api/datasets/${encodeURIComponent(id)}/mapping`, mapping);
}

export function useSaveMapping(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (mapping: DatasetMapping) => saveMapping(id, mapping),
    onSuccess: (dataset) => {
      queryClient.setQueryData(datasetKeys.detail(id), dataset);
      return queryClient.invalidateQueries({ queryKey: datasetKeys.list() });
    },
  });
}
