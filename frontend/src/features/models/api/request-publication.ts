import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ModelRunSummary } from '../../../../../shared/models';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export function requestPublication(input: { id: string; comment?: string }): Promise<ModelRunSummary> {
  return api.post(`/api/models/${encodeURIComponent(input.id)}/publication-request`, {
    comment: input.comment || undefined,
  });
}

export function useRequestPublication() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: requestPublication,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: modelKeys.all }),
  });
}
