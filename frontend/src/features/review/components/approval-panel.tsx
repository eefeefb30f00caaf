import { useId, useState } from 'react';
import type { ApprovalBody, ApprovalStatusView } from '../../../../../shared/privacy';
import { Button } from '../../../components/button';
import { ErrorNotice } from '../../../components/error-notice';
import { ApprovalStateBadge } from './approval-state';

export type ApprovalPanelProps = {
  status: ApprovalStatusView;
  /** present for privacy officers */
  onDecide?: (body: ApprovalBody) => void;
  busy?: boolean;
  error?: unknown;
};

/** Where the dataset stands, its decisions so far, and the privacy officer's approve / send back. */
export function ApprovalPanel({ status, onDecide, busy, error }: ApprovalPanelProps) {
  const id = useId();
  const [comment, setComment] = useState('');
  const decidable = status.state !== 'not-mapped';
  return (
    <div>
      <p className="mb-2">
        <ApprovalStateBadge state={status.state} />
      </p>
      {status.reasons.map((reason) => (
        <p key={reason} className="text-sm text-slate-700">
          {reason}
        </p>
      ))}
      {status.history.length > 0 && (
        <ul className="mt-3 space-y-1 text-sm text-slate-600">
          {status.history.map((h) => (
            <li key={h.decidedAt}>
              {h.decision === 'approved' ? 'Approved' : 'Sent back'} by {h.decidedBy} on{' '}
              {new Date(h.decidedAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}{' '}
              under policy version {h.policyVersion}
              {h.comment ? `: “${h.comment}”` : ''}
            </li>
          ))}
        </ul>
      )}
      {onDecide && decidable && (
        <div className="mt-4 border-t border-sand-200 pt-4">
          <label htmlFor={id} className="block text-sm font-medium text-slate-800">
            Comment (needed to send back)
          </label>
          <textarea
            id={id}
            rows={2}
            value={comment}
            onChange={(e) => setComment(e.target.value)}
            className="mt-1 mb-3 block w-full max-w-xl rounded-md border border-slate-300 bg-white px-3 py-2 text-sm"
          />
          {error !== undefined && error !== null && (
            <div className="mb-3">
              <ErrorNotice error={error} title="The decision was not saved" />
            </div>
          )}
          <div className="flex gap-2">
            <Button
              busy={busy}
              onClick={() => onDecide({ decision: 'approve', comment: comment.trim() || undefined })}
            >
              Approve for modelling under policy version {status.currentPolicyVersion}
            </Button>
            <Button
              variant="secondary"
              disabled={busy || comment.trim().length < 3}
              onClick={() => onDecide({ decision: 'send-back', comment: comment.trim() })}
            >
              Send back
            </Button>
          </div>
        </div>
      )}
    </div>
  );
}
