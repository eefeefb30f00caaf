import { useId, useState } from 'react';
import type { ModelRunDetail } from '../../../../../shared/models';
import { Button } from '../../../components/button';
import { ErrorNotice } from '../../../components/error-notice';
import { PUBLICATION_WORDS } from './run-status';

export type PublicationPanelProps = {
  run: Pick<ModelRunDetail, 'status' | 'publicationState' | 'publicationComment' | 'needsReview'>;
  canRequest: boolean;
  canSendBack: boolean;
  onRequest: (comment: string) => Promise<unknown>;
  onSendBack: (comment: string) => Promise<unknown>;
};

/** Where the run stands on its way to the managers, and the step the signed-in person can take. */
export function PublicationPanel({
  run,
  canRequest,
  canSendBack,
  onRequest,
  onSendBack,
}: PublicationPanelProps) {
  const id = useId();
  const [comment, setComment] = useState('');
  const [error, setError] = useState<unknown>(null);
  const [busy, setBusy] = useState(false);
  const act = (action: (comment: string) => Promise<unknown>) => async () => {
    setBusy(true);
    setError(null);
    try {
      await action(comment.trim());
      setComment('');
    } catch (e) {
      setError(e);
    } finally {
      setBusy(false);
    }
  };
  const mayRequest =
    canRequest &&
    run.status === 'done' &&
    !run.needsReview &&
    (run.publicationState === 'draft' || run.publicationState === 'sent_back');
  const maySendBack = canSendBack && run.publicationState === 'requested';
  return (
    <div className="space-y-3 text-sm">
      <p>
        <span className="font-medium">State: </span>
        {PUBLICATION_WORDS[run.publicationState]}
        {run.publicationComment && <span className="text-slate-700"> — “{run.publicationComment}”</span>}
      </p>
      {run.needsReview && (
        <p className="text-signal-800">
          The privacy policy changed after this run was trained: train a new run before asking for
          publication.
        </p>
      )}
      {(mayRequest || maySendBack) && (
        <>
          <label htmlFor={id} className="block font-medium text-slate-800">
            {maySendBack ? 'What needs to change (required)' : 'A note for the privacy officers (optional)'}
          </label>
          <textarea
            id={id}
            rows={2}
            value={comment}
            onChange={(e) => setComment(e.target.value)}
            className="block w-full rounded-md border border-slate-300 px-3 py-2"
          />
          {mayRequest && (
            <Button busy={busy} onClick={act(onRequest)}>
              Request publication
            </Button>
          )}
          {maySendBack && (
            <Button
              variant="secondary"
              busy={busy}
              disabled={comment.trim().length < 3}
              onClick={act(onSendBack)}
            >
              Send back to the analyst
            </Button>
          )}
        </>
      )}
      {error ? <ErrorNotice error={error} title="That did not work" /> : null}
    </div>
  );
}
