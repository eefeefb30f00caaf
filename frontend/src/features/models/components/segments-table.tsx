import type { ModelSegment } from '../../../../../shared/models';
import { DataTable } from '../../../components/data-table';
import { formatPercent } from '../../../components/stat-figure';
import { WithheldBox } from '../../../components/withheld';

type Shown = Extract<ModelSegment, { withheld: false }>;
const shown = (s: ModelSegment): Shown | null => (s.withheld ? null : s);

/** Every leaf of the tree as a segment in words; small ones are withheld. */
export function SegmentsTable({ segments }: { segments: readonly ModelSegment[] }) {
  return (
    <DataTable
      caption="Segments"
      hideCaption
      rows={segments}
      rowKey={(s) => s.id}
      initialSort={{ key: 'share', direction: 'descending' }}
      columns={[
        {
          key: 'rule',
          header: 'Segment',
          sortValue: (s) => shown(s)?.rule,
          cell: (s) => shown(s)?.rule ?? <WithheldBox />,
        },
        {
          key: 'n',
          header: 'Employees',
          align: 'right',
          sortValue: (s) => shown(s)?.n,
          cell: (s) => shown(s)?.n.toLocaleString('en-GB') ?? '–',
        },
        {
          key: 'positive',
          header: 'Leavers',
          align: 'right',
          sortValue: (s) => shown(s)?.positive,
          cell: (s) => shown(s)?.positive.toLocaleString('en-GB') ?? '–',
        },
        {
          key: 'share',
          header: 'Leaver share',
          align: 'right',
          sortValue: (s) => shown(s)?.share,
          cell: (s) => {
            const v = shown(s);
            return v ? formatPercent(v.share) : '–';
          },
        },
        {
          key: 'lift',
          header: 'Lift over base rate',
          align: 'right',
          sortValue: (s) => shown(s)?.lift,
          cell: (s) => {
            const v = shown(s);
            return v && Number.isFinite(v.lift) ? `${v.lift.toFixed(2)}×` : '–';
          },
        },
      ]}
    />
  );
}
