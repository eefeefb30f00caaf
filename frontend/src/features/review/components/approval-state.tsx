import type { ApprovalState } from '../../../../../shared/privacy';

export const APPROVAL_STATE_LABELS: Record<ApprovalState, string> = {
  'not-mapped': 'Not mapped yet',
  'awaiting-review': 'Waiting for review',
  'sent-back': 'Sent back to the analyst',
  approved: 'Approved for modelling',
  'needs-review': 'Needs review: the policy changed',
};

const tones: Record<ApprovalState, string> = {
  'not-mapped': 'border-slate-300 bg-slate-50 text-slate-700',
  'awaiting-review': 'border-sand-400 bg-sand-100 text-slate-800',
  'sent-back': 'border-sand-500 bg-sand-100 text-slate-800',
  approved: 'border-moss-300 bg-moss-50 text-moss-900',
  'needs-review': 'border-signal-200 bg-signal-50 text-signal-700',
};

export function ApprovalStateBadge({ state }: { state: ApprovalState }) {
  return (
    <span className={`inline-block rounded-full border px-2.5 py-0.5 text-xs font-medium ${tones[state]}`}>
      {APPROVAL_STATE_LABELS[state]}
    </span>
  );
}
