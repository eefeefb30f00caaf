import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PublicationResponse } from '../../../../../shared/briefs';
import { api } from '../../../lib/api-client';
import { briefKeys } from './brief-keys';

export function publishRun(input: { runId: string; comment?: string }): Promise<PublicationResponse> {
  return api.post(
    `/api/models/${encodeURIComponent(input.runId)}/publish`,
    input.comment ? { comment: input.comment } : {},
  );
}

export function usePublishRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: publishRun,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: briefKeys.all }),
  });
}
