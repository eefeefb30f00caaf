import type { BriefDriver, TeamBrief, TeamBriefResponse } from '../../../../../shared/briefs';
import { Card } from '../../../components/card';
import { Caution } from '../../../components/caution';
import { RateComparison } from '../../../components/charts/rate-comparison';
import { RiskBands } from '../../../components/charts/risk-bands';
import { DataTable } from '../../../components/data-table';
import { formatPercent, StatFigure } from '../../../components/stat-figure';
import { isWithheldValue, WITHHELD_TEXT, WithheldBox } from '../../../components/withheld';

function formatDate(iso: string): string {
  return new Date(iso).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric' });
}

const directionStyle: Record<BriefDriver['direction'], string> = {
  raises: 'bg-signal-100 text-signal-700 border-signal-200',
  lowers: 'bg-moss-100 text-moss-800 border-moss-300',
  'about the same': 'bg-slate-100 text-slate-700 border-slate-300',
};

function DriverCard({ driver }: { driver: BriefDriver }) {
  return (
    <li
      className="break-inside-avoid rounded-lg border border-sand-200 bg-white p-4"
      data-testid="driver-card"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold text-slate-900">{driver.feature}</h3>
        <span
          className={`rounded-full border px-2 py-0.5 text-xs font-medium ${directionStyle[driver.direction]}`}
        >
          {driver.direction === 'about the same'
            ? 'about the same as the organisation'
            : `${driver.direction} · about ${driver.points} ${driver.points === 1 ? 'point' : 'points'}`}
        </span>
      </div>
      <p className="mt-2 text-sm text-slate-700">{driver.sentence}</p>
      <div className="mt-3 border-t border-sand-100 pt-2 text-sm">
        <span className="font-medium text-slate-800">Suggested action: </span>
        <span className="text-slate-700">
          {driver.suggestedAction ?? 'No suggestion from the analyst yet.'}
        </span>
      </div>
    </li>
  );
}

function FullBrief({ brief }: { brief: TeamBrief }) {
  const { team, department, organisation } = brief.figures;
  const orgRate = organisation.attritionRate;
  return (
    <div className="space-y-6">
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <StatFigure label="Headcount" value={team.headcount} />
        <StatFigure label="Leavers in the window" value={team.leavers} />
        <StatFigure
          label="Attrition rate"
          value={team.attritionRate}
          format={(x) => formatPercent(x)}
          hint={`Organisation: ${isWithheldValue(orgRate) ? WITHHELD_TEXT : formatPercent(orgRate)}`}
        />
        <StatFigure
          label="Expected leaver share (model)"
          value={`${brief.expectedLeaverShare.team}%`}
          hint={`Organisation: ${brief.expectedLeaverShare.organisation}%`}
        />
      </dl>

      <div className="grid gap-6 lg:grid-cols-2">
        <Card title="Attrition rate compared" className="break-inside-avoid">
          <RateComparison
            title="Team, department and organisation"
            description="Leavers in the window as a share of everyone employed at some point in it."
            rates={[
              { label: brief.team.name, rate: team.attritionRate },
              ...(department ? [{ label: department.name, rate: department.attritionRate }] : []),
              { label: 'Organisation', rate: organisation.attritionRate },
            ]}
          />
        </Card>
        <Card title="Spread over risk bands" className="break-inside-avoid">
          <RiskBands bands={brief.riskBands.bands.map((b) => ({ band: b.band, count: b.employees }))} />
          <p className="mt-2 text-xs text-slate-600">{brief.riskBands.rule}</p>
        </Card>
      </div>

      <section aria-labelledby="drivers-heading">
        <h2 id="drivers-heading" className="mb-2 text-lg font-semibold text-moss-900">
          Top drivers for this team
        </h2>
        <p className="mb-3 text-sm text-slate-600">
          How much each factor moves the team’s expected leaver share, compared with the organisation as a
          whole.
        </p>
        {brief.drivers.length === 0 ? (
          <p className="text-slate-600">The model has no drivers to show for this team.</p>
        ) : (
          <ul className="grid gap-3 md:grid-cols-2">
            {brief.drivers.map((driver) => (
              <DriverCard key={driver.feature} driver={driver} />
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="segments-heading" className="break-inside-avoid">
        <h2 id="segments-heading" className="mb-2 text-lg font-semibold text-moss-900">
          Segments your team falls into
        </h2>
        <DataTable
          caption={`Segments holding at least ${brief.k} of the team’s employees`}
          columns={[
            { key: 'rule', header: 'Segment', cell: (s) => s.rule },
            {
              key: 'employees',
              header: 'Employees of the team',
              cell: (s) => s.employees,
              sortValue: (s) => s.employees,
              align: 'right',
            },
            {
              key: 'share',
              header: 'Leaver share (organisation)',
              cell: (s) => `${s.leaverShare}%`,
              sortValue: (s) => s.leaverShare,
              align: 'right',
            },
          ]}
          rows={brief.segments}
          rowKey={(s) => s.id}
          empty={`No segment holds ${brief.k} or more of this team’s employees, so none is shown.`}
        />
      </section>
    </div>
  );
}

export type TeamBriefViewProps = {
  brief: TeamBriefResponse;
};

/** A team brief: headline figures, rates compared, risk bands, drivers, segments and the caution. */
export function TeamBriefView({ brief }: TeamBriefViewProps) {
  return (
    <article
      className="space-y-6 print:[print-color-adjust:exact]"
      aria-label={`Team brief: ${brief.team.name}`}
    >
      <p className="text-sm text-slate-600">
        {brief.team.department && <>Department {brief.team.department} · </>}
        {!brief.withheld && brief.window && (
          <>
            Data window {formatDate(brief.window.start)} to {formatDate(brief.window.end)} ·{' '}
          </>
        )}
        Published {formatDate(brief.publishedAt)} · Groups smaller than {brief.k} employees are withheld
      </p>
      <Caution />
      {brief.withheld ? (
        <div className="hatch-withheld rounded-lg border border-slate-300 p-6" data-withheld="true">
          <p className="rounded bg-white/90 p-3 text-slate-800">
            <WithheldBox className="mr-2" />
            This team has fewer than {brief.k} employees, so it has no brief: nothing about it is shown.
          </p>
        </div>
      ) : (
        <FullBrief brief={brief} />
      )}
    </article>
  );
}
