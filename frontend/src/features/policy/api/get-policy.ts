import { queryOptions, useQuery } from '@tanstack/react-query';
import { type Policy, policySchema } from '../../../../../shared/policy';
import { api } from '../../../lib/api-client';
import { policyKeys } from './policy-keys';

export function getPolicy(): Promise<Policy> {
  return api.get('/api/policy', { schema: policySchema });
}

export const policyQueryOptions = () => queryOptions({ queryKey: policyKeys.current(), queryFn: getPolicy });

export function usePolicy() {
  return useQuery(policyQueryOptions());
}
