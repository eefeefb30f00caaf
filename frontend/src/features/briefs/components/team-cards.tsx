import { Link } from 'react-router-dom';
import type { TeamSummary } from '../../../../../shared/briefs';
import { formatCount, formatPercent } from '../../../components/stat-figure';
import { isWithheldValue, WithheldBox } from '../../../components/withheld';

export type TeamCardsProps = {
  teams: readonly TeamSummary[];
  /** the link of each team's brief */
  hrefOf: (team: TeamSummary) => string;
};

function Rate({ label, value }: { label: string; value: TeamSummary['attritionRate'] }) {
  return (
    <div>
      <dt className="text-xs font-medium uppercase tracking-wide text-slate-500">{label}</dt>
      <dd className="mt-0.5 text-lg font-semibold tabular-nums text-moss-900">
        {value === undefined ? (
          '–'
        ) : isWithheldValue(value) ? (
          <WithheldBox className="text-xs" />
        ) : (
          formatPercent(value)
        )}
      </dd>
    </div>
  );
}

/** "My teams": one card per team with headcount and attrition rate beside the organisation's, or withheld. */
export function TeamCards({ teams, hrefOf }: TeamCardsProps) {
  return (
    <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3" aria-label="Teams">
      {teams.map((team) => (
        <li key={team.id} data-withheld={team.withheld || undefined}>
          <Link
            to={hrefOf(team)}
            className={`block h-full rounded-lg border p-5 shadow-sm transition-colors hover:border-moss-400 focus-visible:outline-2 focus-visible:outline-moss-600 ${
              team.withheld ? 'hatch-withheld border-slate-300' : 'border-sand-200 bg-white'
            }`}
          >
            <h2 className="text-base font-semibold text-slate-900">
              <span className={team.withheld ? 'rounded bg-white/90 px-1' : ''}>{team.name}</span>
            </h2>
            {team.department && (
              <p className="text-sm text-slate-600">
                <span className={team.withheld ? 'rounded bg-white/90 px-1' : ''}>{team.department}</span>
              </p>
            )}
            {team.withheld ? (
              <p className="mt-4">
                <WithheldBox />
              </p>
            ) : (
              <dl className="mt-4 grid grid-cols-3 gap-3">
                <div>
                  <dt className="text-xs font-medium uppercase tracking-wide text-slate-500">Headcount</dt>
                  <dd className="mt-0.5 text-lg font-semibold tabular-nums text-moss-900">
                    {team.headcount === null ? '–' : formatCount(team.headcount)}
                  </dd>
                </div>
                <Rate label="Attrition" value={team.attritionRate} />
                <Rate label="Organisation" value={team.organisationRate} />
              </dl>
            )}
          </Link>
        </li>
      ))}
    </ul>
  );
}
