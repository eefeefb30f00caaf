import { type FormEvent, useId } from 'react';
import { AUDIT_ACTION_LABELS, type AuditQueryInput } from '../../../../../shared/audit';
import { Button } from '../../../components/button';

export type AuditFilterValues = Pick<
  AuditQueryInput,
  'actor' | 'action' | 'objectType' | 'objectId' | 'from' | 'to'
>;

export type AuditFiltersProps = {
  value: AuditFilterValues;
  onApply: (filters: AuditFilterValues) => void;
};

const inputClass = 'mt-1 block w-full rounded-md border border-slate-300 bg-white px-3 py-2 text-sm';

/** `datetime-local` works in local time without a zone; the API takes ISO 8601 with one. */
function toLocalInput(iso: string | undefined): string {
  if (!iso) return '';
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '';
  const local = new Date(date.getTime() - date.getTimezoneOffset() * 60_000);
  return local.toISOString().slice(0, 16);
}

function toIso(local: FormDataEntryValue | null): string | undefined {
  if (typeof local !== 'string' || local === '') return undefined;
  const date = new Date(local);
  return Number.isNaN(date.getTime()) ? undefined : date.toISOString();
}

function text(value: FormDataEntryValue | null): string | undefined {
  return typeof value === 'string' && value.trim() !== '' ? value.trim() : undefined;
}

export function AuditFilters({ value, onApply }: AuditFiltersProps) {
  const id = useId();
  const submit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    onApply({
      actor: text(data.get('actor')),
      action: text(data.get('action')),
      objectType: text(data.get('objectType')),
      objectId: text(data.get('objectId')),
      from: toIso(data.get('from')),
      to: toIso(data.get('to')),
    });
  };
  const field = (name: keyof AuditFilterValues, label: string, input: React.ReactNode) => (
    <div>
      <label htmlFor={`${id}-${name}`} className="block text-sm font-medium text-slate-800">
        {label}
      </label>
      {input}
    </div>
  );
  // Remount on new values so the uncontrolled inputs show them.
  const key = JSON.stringify(value);
  return (
    <form
      key={key}
      onSubmit={submit}
      aria-label="Filter the audit trail"
      className="grid gap-3 md:grid-cols-3"
    >
      {field(
        'actor',
        'Who (e-mail contains)',
        <input
          id={`${id}-actor`}
          name="actor"
          type="search"
          defaultValue={value.actor ?? ''}
          className={inputClass}
        />,
      )}
      {field(
        'action',
        'What',
        <input
          id={`${id}-action`}
          name="action"
          list={`${id}-actions`}
          defaultValue={value.action ?? ''}
          placeholder="e.g. policy. for every policy action"
          className={inputClass}
        />,
      )}
      <datalist id={`${id}-actions`}>
        {Object.entries(AUDIT_ACTION_LABELS).map(([action, label]) => (
          <option key={action} value={action}>
            {label}
          </option>
        ))}
      </datalist>
      {field(
        'objectType',
        'Object type',
        <input
          id={`${id}-objectType`}
          name="objectType"
          defaultValue={value.objectType ?? ''}
          placeholder="dataset, model, policy…"
          className={inputClass}
        />,
      )}
      {field(
        'objectId',
        'Object id',
        <input
          id={`${id}-objectId`}
          name="objectId"
          defaultValue={value.objectId ?? ''}
          className={inputClass}
        />,
      )}
      {field(
        'from',
        'From',
        <input
          id={`${id}-from`}
          name="from"
          type="datetime-local"
          defaultValue={toLocalInput(value.from)}
          className={inputClass}
        />,
      )}
      {field(
        'to',
        'To',
        <input
          id={`${id}-to`}
          name="to"
          type="datetime-local"
          defaultValue={toLocalInput(value.to)}
          className={inputClass}
        />,
      )}
      <div className="flex gap-2 md:col-span-3">
        <Button type="submit">Apply filters</Button>
        <Button variant="quiet" onClick={() => onApply({})}>
          Clear
        </Button>
      </div>
    </form>
  );
}
