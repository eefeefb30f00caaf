import { Caution } from '../../components/caution';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { useTeams } from '../../features/briefs/api/get-teams';
import { TeamCards } from '../../features/briefs/components/team-cards';
import { hasRole, useMe } from '../../lib/auth';

export function MyTeamsRoute() {
  const me = useMe().data;
  const teams = useTeams();
  const preview = hasRole(me, 'analyst', 'privacy_officer');
  return (
    <>
      <PageHeader
        title={preview ? 'Team briefs' : 'My teams'}
        description={
          preview
            ? 'Every team of the published briefs. Open one to preview it exactly as its manager sees it.'
            : 'The teams you manage, from the latest published briefs. Open a team to read its brief.'
        }
      />
      <div className="space-y-6">
        <Caution />
        {teams.isPending && <p className="text-slate-600">Loading teams…</p>}
        {teams.isError && <ErrorNotice error={teams.error} title="The teams could not be loaded" />}
        {teams.data && teams.data.length === 0 && (
          <p className="text-slate-600">
            No team briefs are published {preview ? 'at the moment' : 'for your teams yet'}. You will get an
            e-mail when they are.
          </p>
        )}
        {teams.data && teams.data.length > 0 && (
          <TeamCards teams={teams.data} hrefOf={(team) => paths.teamBrief.href(team.id)} />
        )}
      </div>
    </>
  );
}
