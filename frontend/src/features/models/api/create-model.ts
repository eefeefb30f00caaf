import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ModelRunCreated, ModelRunRequest } from '../../../../../shared/models';
import { api } from '../../../lib/api-client';
import { modelKeys } from './model-keys';

export function createModel(body: ModelRunRequest): Promise<ModelRunCreated> {
  return api.post('/api/models', body);
}

export function useCreateModel() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createModel,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: modelKeys.all }),
  });
}
