import { Link, useParams } from 'react-router-dom';
import { Button } from '../../components/button';
import { ErrorNotice } from '../../components/error-notice';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';
import { briefCsvHref } from '../../features/briefs/api/export-brief';
import { useTeamBrief } from '../../features/briefs/api/get-team-brief';
import { TeamBriefView } from '../../features/briefs/components/team-brief-view';
import { hasRole, useMe } from '../../lib/auth';

export function TeamBriefRoute() {
  const { id = '' } = useParams();
  const me = useMe().data;
  const brief = useTeamBrief(id);
  const preview = hasRole(me, 'analyst', 'privacy_officer');
  const back = (
    <Link to={paths.teams.href()} className="text-sm text-moss-800 underline print:hidden">
      ← {preview ? 'All team briefs' : 'My teams'}
    </Link>
  );
  if (brief.isPending) return <p className="text-slate-600">Loading the brief…</p>;
  if (brief.isError)
    return (
      <div className="space-y-4">
        {back}
        <ErrorNotice error={brief.error} title="The brief could not be opened" />
      </div>
    );
  const b = brief.data;
  return (
    <>
      {back}
      <PageHeader
        title={`Team brief: ${b.team.name}`}
        actions={
          <>
            <a
              href={briefCsvHref(b.team.id)}
              download
              className="inline-flex items-center rounded-md border border-moss-300 bg-white px-4 py-2 text-sm font-medium text-moss-800 hover:bg-moss-50"
            >
              Export CSV
            </a>
            <Button variant="secondary" onClick={() => window.print()}>
              Print
            </Button>
          </>
        }
      />
      {preview && (
        <p className="mb-4 rounded-md border border-slate-300 bg-slate-50 px-4 py-2 text-sm text-slate-700 print:hidden">
          Preview: this is exactly what the team’s manager sees.
        </p>
      )}
      <TeamBriefView brief={b} />
    </>
  );
}
