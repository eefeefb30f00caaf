import { queryOptions, useQuery } from '@tanstack/react-query';
import { type Policy, policyHistorySchema } from '../../../../../shared/policy';
import { api } from '../../../lib/api-client';
import { policyKeys } from './policy-keys';

export function getPolicyVersions(): Promise<Policy[]> {
  return api.get('/api/policy/versions', { schema: policyHistorySchema });
}

export const policyVersionsQueryOptions = () =>
  queryOptions({ queryKey: policyKeys.versions(), queryFn: getPolicyVersions });

export function usePolicyVersions() {
  return useQuery(policyVersionsQueryOptions());
}
