/** The one query-key factory of the briefs feature. */
export const briefKeys = {
  all: ['briefs'] as const,
  teams: () => [...briefKeys.all, 'teams'] as const,
  brief: (teamId: string) => [...briefKeys.all, 'brief', teamId] as const,
};
