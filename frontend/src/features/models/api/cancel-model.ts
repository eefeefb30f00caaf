import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ModelRunStatus } from '../../../../../shared/models';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export function cancelModel(id: string): Promise<{ status: ModelRunStatus }> {
  return api.post(`/api/models/${encodeURIComponent(id)}/cancel`);
}

export function useCancelModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: cancelModel,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: modelKeys.all }),
  });
}
