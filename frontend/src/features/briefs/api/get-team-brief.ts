import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TeamBriefResponse } from '../../../../../shared/briefs';
import { api } from '../../../lib/api-client';
import { briefKeys } from './brief-keys';

export function getTeamBrief(teamId: string): Promise<TeamBriefResponse> {
  return api.get<TeamBriefResponse>(`/api/teams/${encodeURIComponent(teamId)}/brief`);
}

export const teamBriefQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: briefKeys.brief(teamId),
    queryFn: () => getTeamBrief(teamId),
    staleTime: 5 * 60_000,
  });

export function useTeamBrief(teamId: string) {
  return useQuery(teamBriefQueryOptions(teamId));
}
