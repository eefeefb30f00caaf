import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ModelRunSummary } from '../../../../../shared/models';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export function sendBack(input: { id: string; comment: string }): Promise<ModelRunSummary> {
  return api.post(`/api/models/${encodeURIComponent(input.id)}/send-back`, { comment: input.comment });
}

export function useSendBack() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendBack,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: modelKeys.all }),
  });
}
