import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { type AuditPage, type AuditQueryInput, auditPageSchema } from '../../../../../shared/audit';
import { api } from '../../../lib/api-client';
import { auditKeys } from './audit-keys';

/** The query string of an audit request: only the filters that are set. */
export function auditSearchParams(query: AuditQueryInput): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== null && value !== '') params.set(key, String(value));
  }
  return params;
}

export function getAuditPage(query: AuditQueryInput): Promise<AuditPage> {
  const search = auditSearchParams(query).toString();
  return api.get(`/api/audit${search ? `?${search}` : ''}`, { schema: auditPageSchema });
}

export const auditPageQueryOptions = (query: AuditQueryInput) =>
  queryOptions({
    queryKey: auditKeys.page(query),
    queryFn: () => getAuditPage(query),
    placeholderData: keepPreviousData,
  });

export function useAuditPage(query: AuditQueryInput) {
  return useQuery(auditPageQueryOptions(query));
}
