import { queryOptions, useQuery } from '@tanstack/react-query';
import { type ProxyReportView, proxyReportSchema } from '../../../../../shared/privacy';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './review-keys';

export function getProxyReport(datasetId: string): Promise<ProxyReportView> {
  return api.get(`/api/datasets/${encodeURIComponent(datasetId)}/proxies`, { schema: proxyReportSchema });
}

export const proxyReportQueryOptions = (datasetId: string) =>
  queryOptions({ queryKey: reviewKeys.proxies(datasetId), queryFn: () => getProxyReport(datasetId) });

export function useProxyReport(datasetId: string, enabled = true) {
  return useQuery({ ...proxyReportQueryOptions(datasetId), enabled });
}
