import type { ProxyDecisionBody, ProxyRowView } from '../../../../../shared/privacy';
import { Button } from '../../../components/button';
import { DataTable, type DataTableColumn } from '../../../components/data-table';
import { StrengthBar } from './strength-bar';

export type ProxyReportTableProps = {
  rows: readonly ProxyRowView[];
  threshold: number;
  /** quantile bins used for numbers and dates */
  bins: number;
  /** present for privacy officers: ask for a reason and decide */
  onDecide?: (row: ProxyRowView, decision: ProxyDecisionBody['decision']) => void;
};

const strengthWords: Record<ProxyRowView['strength'], string> = {
  negligible: 'negligible',
  small: 'small',
  medium: 'medium',
  large: 'large',
};

function binsNote(row: ProxyRowView): string | null {
  const parts = [
    row.featureBins !== null ? `${row.feature} in ${row.featureBins} quantile bins` : null,
    row.blockedFieldBins !== null ? `${row.blockedField} in ${row.blockedFieldBins} quantile bins` : null,
  ].filter(Boolean);
  return parts.length ? parts.join('; ') : null;
}

/** Every allowed field against every blocked field, strongest first, flagged ones marked. */
export function ProxyReportTable({ rows, threshold, bins, onDecide }: ProxyReportTableProps) {
  const columns: DataTableColumn<ProxyRowView>[] = [
    {
      key: 'feature',
      header: 'Allowed field',
      cell: (r) => (
        <span>
          {r.feature}
          {binsNote(r) && <span className="block text-xs text-slate-500">{binsNote(r)}</span>}
        </span>
      ),
      sortValue: (r) => r.feature,
    },
    {
      key: 'blocked',
      header: 'Blocked field',
      cell: (r) => r.blockedField,
      sortValue: (r) => r.blockedField,
    },
    {
      key: 'v',
      header: "Cramér's V",
      cell: (r) => <StrengthBar value={r.cramersV} threshold={threshold} flagged={r.flagged} />,
      sortValue: (r) => r.cramersV,
    },
    {
      key: 'nmi',
      header: 'Normalised mutual information',
      cell: (r) => r.normalisedMutualInformation.toFixed(2),
      sortValue: (r) => r.normalisedMutualInformation,
      align: 'right',
    },
    {
      key: 'status',
      header: 'Status',
      cell: (r) =>
        r.decision ? (
          <span>
            {r.decision.decision === 'block' ? 'Blocked as a proxy' : 'Accepted'}
            <span className="block text-xs text-slate-500">“{r.decision.reason}”</span>
          </span>
        ) : r.flagged ? (
          <span className="font-medium text-signal-700">Possible proxy: {strengthWords[r.strength]}</span>
        ) : (
          <span className="text-slate-600">{strengthWords[r.strength]}</span>
        ),
    },
  ];
  if (onDecide) {
    columns.push({
      key: 'decide',
      header: 'Decision',
      cell: (r) =>
        r.flagged && !r.decision ? (
          <span className="flex gap-2">
            <Button
              size="sm"
              variant="danger"
              onClick={() => onDecide(r, 'block')}
              aria-label={`Block ${r.feature}`}
            >
              Block
            </Button>
            <Button
              size="sm"
              variant="secondary"
              onClick={() => onDecide(r, 'accept')}
              aria-label={`Accept ${r.feature}`}
            >
              Accept
            </Button>
          </span>
        ) : null,
    });
  }
  return (
    <div>
      <p className="mb-2 text-sm text-slate-600">
        Numbers and dates are cut into {bins} quantile bins; a missing value counts as its own group. Pairs at
        or above the threshold of {threshold.toFixed(2)} (the dark mark) are flagged. 0.1, 0.3 and 0.5 are
        conventionally small, medium and large associations.
      </p>
      <DataTable
        caption="Association of each allowed field with each blocked field"
        hideCaption
        columns={columns}
        rows={rows}
        rowKey={(r) => `${r.feature}\u0000${r.blockedField}`}
        initialSort={{ key: 'v', direction: 'descending' }}
        empty="No blocked field is in this dataset, so there is nothing to compare."
      />
    </div>
  );
}
