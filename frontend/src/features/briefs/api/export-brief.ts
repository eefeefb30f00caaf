/** The CSV export is a plain download: the browser sends the session cookie with the link. */
export function briefCsvHref(teamId: string): string {
  return `/api/teams/${encodeURIComponent(teamId)}/brief.csv`;
}
