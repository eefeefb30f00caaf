import { useMutation, useQueryClient } from '@tanstack/react-query';
import { type Policy, type PolicyUpdate, policySchema } from '../../../../../shared/policy';
import { api } from '../../../lib/api-client';
import { policyKeys } from './policy-keys';

export function updatePolicy(update: PolicyUpdate): Promise<Policy> {
  return api.put('/api/policy', update, { schema: policySchema });
}

export function useUpdatePolicy() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updatePolicy,
    onSuccess: (policy) => {
      queryClient.setQueryData(policyKeys.current(), policy);
      void queryClient.invalidateQueries({ queryKey: policyKeys.all });
    },
  });
}
