import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export type DriverActionInput = { id: string; feature: string; text: string };

export function saveDriverAction({ id, feature, text }: DriverActionInput) {
  return api.put<{ feature: string; suggestedAction: string }>(
    `/api/models/${encodeURIComponent(id)}/drivers/${encodeURIComponent(feature)}/action`,
    { text },
  );
}

export function useSaveDriverAction() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveDriverAction,
    onSuccess: (_data, input) => queryClient.invalidateQueries({ queryKey: modelKeys.detail(input.id) }),
  });
}
