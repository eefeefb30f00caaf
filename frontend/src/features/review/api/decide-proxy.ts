import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  type ProxyDecisionBody,
  type ProxyReportView,
  proxyReportSchema,
} from '../../../../../shared/privacy';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './review-keys';

export function decideProxy(datasetId: string, body: ProxyDecisionBody): Promise<ProxyReportView> {
  return api.post(`/api/datasets/${encodeURIComponent(datasetId)}/proxies/decisions`, body, {
    schema: proxyReportSchema,
  });
}

/** Blocking a proxy changes the privacy policy too, so every policy query is refreshed as well. */
export function useDecideProxy(datasetId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ProxyDecisionBody) => decideProxy(datasetId, body),
    onSuccess: (report) => {
      queryClient.setQueryData(reviewKeys.proxies(datasetId), report);
      void queryClient.invalidateQueries({ queryKey: reviewKeys.all });
      void queryClient.invalidateQueries({ queryKey: ['policy'] });
    },
  });
}
