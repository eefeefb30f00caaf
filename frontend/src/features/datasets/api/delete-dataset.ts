import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { datasetKeys } from './dataset-keys';

export function deleteDataset(id: string): Promise<void> {
  return api.delete<void>(`/api/datasets/${encodeURIComponent(id)}`);
}

export function useDeleteDataset() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteDataset,
    onSuccess: (_result, id) => {
      queryClient.removeQueries({ queryKey: datasetKeys.detail(id) });
      return queryClient.invalidateQueries({ queryKey: datasetKeys.list() });
    },
  });
}
