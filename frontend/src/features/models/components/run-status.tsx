import type { ModelRunDetail, ModelRunSummary } from '../../../../../shared/models';
import { Button } from '../../../components/button';
import { ProgressBar } from '../../../components/progress-bar';

export const STATUS_WORDS: Record<ModelRunSummary['status'], string> = {
  queued: 'Queued',
  running: 'Training',
  done: 'Done',
  failed: 'Failed',
  cancelled: 'Cancelled',
};

export const PUBLICATION_WORDS: Record<ModelRunSummary['publicationState'], string> = {
  draft: 'Draft',
  requested: 'Publication requested',
  sent_back: 'Sent back',
  published: 'Published',
  withdrawn: 'Withdrawn',
};

export type RunStatusProps = {
  run: Pick<ModelRunDetail, 'status' | 'progress' | 'phase' | 'error'>;
  onCancel?: () => void;
  cancelling?: boolean;
};

/** Progress while a run is queued or training, with a way to stop it; the failure when it failed. */
export function RunStatus({ run, onCancel, cancelling }: RunStatusProps) {
  if (run.status === 'queued' || run.status === 'running') {
    return (
      <div className="flex items-end gap-4 rounded-lg border border-sand-200 bg-white p-4">
        <ProgressBar
          value={run.status === 'queued' ? undefined : run.progress}
          label={run.status === 'queued' ? 'Waiting for a worker' : 'Training'}
          phase={run.phase ?? undefined}
        />
        {onCancel && (
          <Button variant="secondary" size="sm" onClick={onCancel} busy={cancelling}>
            Cancel run
          </Button>
        )}
      </div>
    );
  }
  if (run.status === 'failed') {
    return (
      <div role="alert" className="rounded-md border-l-4 border-signal-600 bg-signal-50 px-4 py-3 text-sm">
        <p className="font-semibold text-signal-800">The run failed</p>
        <p className="text-slate-800">{run.error}</p>
      </div>
    );
  }
  if (run.status === 'cancelled') {
    return <p className="text-sm text-slate-600">This run was cancelled before it finished.</p>;
  }
  return null;
}
