import type { FairnessGroupView, FairnessReportView } from '../../../../../shared/privacy';
import { DataTable, type DataTableColumn } from '../../../components/data-table';
import { formatPercent } from '../../../components/stat-figure';
import { isWithheldValue, WithheldBox } from '../../../components/withheld';

type Figure = number | null | { withheld: true };

function figure(value: Figure, format: (v: number) => string) {
  if (isWithheldValue(value)) return <WithheldBox />;
  return value === null ? '–' : format(value);
}

const columns: DataTableColumn<FairnessGroupView>[] = [
  {
    key: 'group',
    header: 'Group',
    cell: (g) => (
      <span>
        {g.group}
        {g.reference && <span className="block text-xs text-slate-500">best retained: the comparison</span>}
      </span>
    ),
  },
  { key: 'headcount', header: 'Headcount', cell: (g) => figure(g.headcount, String), align: 'right' },
  {
    key: 'attrition',
    header: 'Attrition rate',
    cell: (g) => figure(g.attritionRate, (v) => formatPercent(v)),
    align: 'right',
  },
  {
    key: 'risk',
    header: 'Mean predicted risk',
    cell: (g) => figure(g.meanPredictedRisk, (v) => formatPercent(v)),
    align: 'right',
  },
  {
    key: 'retention',
    header: 'Retention rate',
    cell: (g) => figure(g.retentionRate, (v) => formatPercent(v)),
    align: 'right',
  },
  {
    key: 'ratio',
    header: 'Ratio to best retained',
    cell: (g) => figure(g.retentionRatio, (v) => v.toFixed(2)),
    align: 'right',
  },
  {
    key: 'flag',
    header: 'Four-fifths rule',
    cell: (g) =>
      g.withheld ? null : g.flagged ? (
        <span className="font-medium text-signal-700">under 0.80: adverse impact indicated</span>
      ) : (
        <span className="text-slate-600">0.80 or more</span>
      ),
  },
];

/** One blocked field's groups: headcount, attrition, mean predicted risk and the four-fifths check. */
export function FairnessTable({ report }: { report: FairnessReportView }) {
  return (
    <section aria-label={`Fairness by ${report.field}`}>
      <h3 className="mb-1 text-base font-semibold text-slate-900">{report.field}</h3>
      <p className="mb-2 text-sm text-slate-600">
        Rule: {report.rule}. Groups of fewer than {report.k} employees are withheld
        {report.bins !== null ? `; values are cut into ${report.bins} quantile bins` : ''}.
      </p>
      <DataTable
        caption={`Groups of ${report.field}`}
        hideCaption
        columns={columns}
        rows={report.groups}
        rowKey={(g) => g.group}
      />
    </section>
  );
}
