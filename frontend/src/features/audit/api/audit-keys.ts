import type { AuditQueryInput } from '../../../../../shared/audit';

export const auditKeys = {
  all: ['audit'] as const,
  page: (query: AuditQueryInput) => [...auditKeys.all, 'page', query] as const,
};
