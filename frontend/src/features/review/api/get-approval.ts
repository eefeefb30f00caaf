import { queryOptions, useQuery } from '@tanstack/react-query';
import { type ApprovalStatusView, approvalStatusSchema } from '../../../../../shared/privacy';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './review-keys';

export function getApproval(datasetId: string): Promise<ApprovalStatusView> {
  return api.get(`/api/datasets/${encodeURIComponent(datasetId)}/approval`, { schema: approvalStatusSchema });
}

export const approvalQueryOptions = (datasetId: string) =>
  queryOptions({ queryKey: reviewKeys.approval(datasetId), queryFn: () => getApproval(datasetId) });

export function useApproval(datasetId: string) {
  return useQuery(approvalQueryOptions(datasetId));
}
