import { queryOptions, useQuery } from '@tanstack/react-query';
import type { TeamSummary } from '../../../../../shared/briefs';
import { api } from '../../../lib/api-client';
import { briefKeys } from './brief-keys';

export function getTeams(): Promise<TeamSummary[]> {
  return api.get<TeamSummary[]>('/api/teams');
}

export const teamsQueryOptions = () => queryOptions({ queryKey: briefKeys.teams(), queryFn: getTeams });

/** A manager's own teams; every team for analysts and privacy officers. */
export function useTeams() {
  return useQuery(teamsQueryOptions());
}
