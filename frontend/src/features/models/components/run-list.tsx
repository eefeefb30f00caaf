import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ModelRunSummary } from '../../../../../shared/models';
import { Button } from '../../../components/button';
import { DataTable } from '../../../components/data-table';
import { PUBLICATION_WORDS, STATUS_WORDS } from './run-status';

export type RunListProps = {
  runs: readonly ModelRunSummary[];
  hrefOf: (id: string) => string;
  onCompare: (ids: string[]) => void;
};

/** Every model run, newest first; tick two or more to compare them. */
export function RunList({ runs, hrefOf, onCompare }: RunListProps) {
  const [chosen, setChosen] = useState<string[]>([]);
  const toggle = (id: string) =>
    setChosen((current) => (current.includes(id) ? current.filter((x) => x !== id) : [...current, id]));
  return (
    <div className="space-y-3">
      <DataTable
        caption="Model runs"
        hideCaption
        rows={runs}
        rowKey={(r) => r.id}
        empty="No model runs yet: start one above."
        columns={[
          {
            key: 'compare',
            header: 'Compare',
            cell: (r) =>
              r.status === 'done' ? (
                <input
                  type="checkbox"
                  aria-label={`Compare the run of ${new Date(r.createdAt).toLocaleString('en-GB')}`}
                  checked={chosen.includes(r.id)}
                  onChange={() => toggle(r.id)}
                  className="h-4 w-4 accent-moss-700"
                />
              ) : null,
          },
          {
            key: 'created',
            header: 'Started',
            sortValue: (r) => r.createdAt,
            cell: (r) => (
              <Link className="text-moss-800 underline" to={hrefOf(r.id)}>
                {new Date(r.createdAt).toLocaleString('en-GB')}
              </Link>
            ),
          },
          {
            key: 'dataset',
            header: 'Dataset',
            sortValue: (r) => r.datasetName,
            cell: (r) => r.datasetName ?? '–',
          },
          {
            key: 'status',
            header: 'Status',
            sortValue: (r) => r.status,
            cell: (r) =>
              r.status === 'running'
                ? `${STATUS_WORDS.running} ${Math.round(r.progress * 100)}%`
                : STATUS_WORDS[r.status],
          },
          {
            key: 'settings',
            header: 'Settings',
            cell: (r) =>
              `${r.settings.criterion}, depth ${r.settings.maxDepth}, min leaf ${r.settings.effectiveMinLeaf}, ${r.settings.pruning === 'cv' ? 'pruned' : 'unpruned'}`,
          },
          {
            key: 'auc',
            header: 'ROC AUC',
            align: 'right',
            sortValue: (r) => r.auc,
            cell: (r) => (r.auc === null ? '–' : r.auc.toFixed(3)),
          },
          {
            key: 'publication',
            header: 'Publication',
            sortValue: (r) => r.publicationState,
            cell: (r) => `${PUBLICATION_WORDS[r.publicationState]}${r.needsReview ? ' · needs review' : ''}`,
          },
        ]}
      />
      <Button variant="secondary" disabled={chosen.length < 2} onClick={() => onCompare(chosen)}>
        Compare {chosen.length >= 2 ? `${chosen.length} runs` : 'runs (tick two or more)'}
      </Button>
    </div>
  );
}
