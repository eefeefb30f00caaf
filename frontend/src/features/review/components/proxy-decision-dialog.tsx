import { useEffect, useId, useState } from 'react';
import type { ProxyDecisionBody, ProxyRowView } from '../../../../../shared/privacy';
import { ConfirmDialog } from '../../../components/confirm-dialog';

export type ProxyDecisionDialogProps = {
  row: ProxyRowView | null;
  decision: ProxyDecisionBody['decision'];
  busy?: boolean;
  onConfirm: (reason: string) => void;
  onCancel: () => void;
};

/** Asks for the written reason a proxy decision needs. */
export function ProxyDecisionDialog({ row, decision, busy, onConfirm, onCancel }: ProxyDecisionDialogProps) {
  const id = useId();
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    if (row) {
      setReason('');
      setError(null);
    }
  }, [row]);
  const block = decision === 'block';
  return (
    <ConfirmDialog
      open={row !== null}
      title={block ? `Block ${row?.feature ?? ''} too?` : `Accept ${row?.feature ?? ''}?`}
      confirmLabel={block ? 'Block the field' : 'Accept with this reason'}
      tone={block ? 'danger' : 'default'}
      busy={busy}
      onCancel={onCancel}
      onConfirm={() => {
        if (reason.trim().length < 3) {
          setError('Write a short reason: it is kept in the audit trail.');
          return;
        }
        onConfirm(reason.trim());
      }}
    >
      <p className="mb-3 text-sm text-slate-700">
        {block
          ? `“${row?.feature}” goes with “${row?.blockedField}” (Cramér's V ${row?.cramersV.toFixed(2)}). Blocking it adds it to the privacy policy's blocked fields as a new version: no model may use it.`
          : `“${row?.feature}” goes with “${row?.blockedField}” (Cramér's V ${row?.cramersV.toFixed(2)}). Accepting it lets models use it; say why that is acceptable.`}
      </p>
      <label htmlFor={id} className="block text-sm font-medium text-slate-800">
        Reason
      </label>
      <textarea
        id={id}
        rows={3}
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className="mt-1 block w-full rounded-md border border-slate-300 bg-white px-3 py-2 text-sm"
      />
      {error && (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-signal-700">
          {error}
        </p>
      )}
    </ConfirmDialog>
  );
}
