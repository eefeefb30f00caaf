import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DatasetMapping, OutcomePreview } from '../../../../../shared/datasets';
import { api } from '../../../lib/api-client';
import { datasetKeys } from './dataset-keys';

export async function previewMapping(id: string, mapping: DatasetMapping): Promise<OutcomePreview> {
  const body = await api.post<{ preview: OutcomePreview }>(
    `/api/datasets/${encodeURIComponent(id)}/mapping/preview`,
    mapping,
  );
  return body.preview;
}

export const mappingPreviewQueryOptions = (id: string, mapping: DatasetMapping | null) =>
  queryOptions({
    queryKey: datasetKeys.preview(id, mapping),
    queryFn: () => previewMapping(id, mapping as DatasetMapping),
    enabled: mapping !== null,
    placeholderData: keepPreviousData,
    staleTime: 60_000,
  });

/** The outcome counts of a mapping not yet saved; null while the form is incomplete. */
export function useMappingPreview(id: string, mapping: DatasetMapping | null) {
  return useQuery(mappingPreviewQueryOptions(id, mapping));
}
