import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PublicationResponse } from '../../../../../shared/briefs';
import { api } from '../../../lib/api-client';
import { briefKeys } from './brief-keys';

export function getPublications(runId: string): Promise<PublicationResponse[]> {
  return api.get<PublicationResponse[]>(`/api/models/${encodeURIComponent(runId)}/publications`);
}

export const publicationsQueryOptions = (runId: string) =>
  queryOptions({
    queryKey: briefKeys.publications(runId),
    queryFn: () => getPublications(runId),
    // while the briefs are being computed, look again every second
    refetchInterval: (query) => (query.state.data?.some((p) => p.status === 'computing') ? 1000 : false),
  });

/** A model run's publications, newest first, with the reason of a withdrawal. */
export function usePublications(runId: string) {
  return useQuery(publicationsQueryOptions(runId));
}
