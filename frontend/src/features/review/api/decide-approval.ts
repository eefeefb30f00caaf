import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  type ApprovalBody,
  type ApprovalStatusView,
  approvalStatusSchema,
} from '../../../../../shared/privacy';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './review-keys';

export function decideApproval(datasetId: string, body: ApprovalBody): Promise<ApprovalStatusView> {
  return api.post(`/api/datasets/${encodeURIComponent(datasetId)}/approval`, body, {
    schema: approvalStatusSchema,
  });
}

export function useDecideApproval(datasetId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ApprovalBody) => decideApproval(datasetId, body),
    onSuccess: (status) => {
      queryClient.setQueryData(reviewKeys.approval(datasetId), status);
      void queryClient.invalidateQueries({ queryKey: reviewKeys.queue() });
    },
  });
}
