import { useId, useState } from 'react';
import { Button } from '../../../components/button';

export type BlockedFieldSuggestion = {
  /** a column name as in the uploaded datasets */
  name: string;
  /** why it is suggested, e.g. the legal basis of the protected characteristic */
  note?: string;
};

export type BlockedFieldsEditorProps = {
  value: readonly string[];
  onChange: (fields: string[]) => void;
  suggestions?: readonly BlockedFieldSuggestion[];
  /** every column name of the uploaded datasets, offered while typing */
  knownColumns?: readonly string[];
  disabled?: boolean;
  error?: string;
};

/** The blocked columns as a removable list, with suggested columns and a box to name any other. */
export function BlockedFieldsEditor({
  value,
  onChange,
  suggestions = [],
  knownColumns = [],
  disabled,
  error,
}: BlockedFieldsEditorProps) {
  const id = useId();
  const [draft, setDraft] = useState('');
  const add = (name: string) => {
    const trimmed = name.trim();
    if (trimmed && !value.includes(trimmed)) onChange([...value, trimmed]);
  };
  const open = suggestions.filter((s) => !value.includes(s.name));

  return (
    <fieldset className="mb-4" aria-describedby={`${id}-hint${error ? ` ${id}-error` : ''}`}>
      <legend className="text-sm font-medium text-slate-800">Blocked fields</legend>
      <p id={`${id}-hint`} className="text-xs text-slate-500">
        Columns that no model may split on and no manager may ever see: protected characteristics such as date
        of birth, sex, ethnicity or disability. They are used only by the fairness screen, on aggregated
        figures, to check that the model treats groups alike.
      </p>
      {value.length === 0 ? (
        <p className="mt-2 text-sm text-slate-600">No field is blocked yet.</p>
      ) : (
        <ul className="mt-2 flex flex-wrap gap-2" aria-label="Blocked fields">
          {value.map((field) => (
            <li
              key={field}
              className="inline-flex items-center gap-1 rounded-full border border-moss-300 bg-moss-50 py-0.5 pr-1 pl-3 text-sm text-moss-900"
            >
              {field}
              {!disabled && (
                <button
                  type="button"
                  onClick={() => onChange(value.filter((f) => f !== field))}
                  className="rounded-full px-1.5 text-slate-600 hover:bg-moss-100 hover:text-slate-900"
                  aria-label={`Unblock ${field}`}
                >
                  ×
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
      {!disabled && open.length > 0 && (
        <div className="mt-3">
          <div className="flex flex-wrap items-center gap-3">
            <p className="text-xs font-medium text-slate-700">
              Suggested from the uploaded datasets: likely protected characteristics
            </p>
            {open.length > 1 && (
              <Button
                size="sm"
                variant="secondary"
                onClick={() => onChange([...value, ...open.map((s) => s.name)])}
              >
                Block all {open.length} suggested
              </Button>
            )}
          </div>
          <ul className="mt-1 space-y-1">
            {open.map((s) => (
              <li key={s.name} className="flex items-start gap-2 text-sm">
                <Button
                  size="sm"
                  variant="secondary"
                  onClick={() => add(s.name)}
                  aria-label={`Block ${s.name}`}
                >
                  Block
                </Button>
                <span>
                  {s.name}
                  {s.note && <span className="block text-xs text-slate-500">{s.note}</span>}
                </span>
              </li>
            ))}
          </ul>
        </div>
      )}
      {!disabled && (
        <div className="mt-3 flex gap-2">
          <label htmlFor={`${id}-new`} className="sr-only">
            Column name to block
          </label>
          <input
            id={`${id}-new`}
            value={draft}
            onChange={(e) => setDraft(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === 'Enter') {
                e.preventDefault();
                add(draft);
                setDraft('');
              }
            }}
            placeholder="Column name, exactly as in the file"
            list={`${id}-columns`}
            className="block w-full max-w-sm rounded-md border border-slate-300 bg-white px-3 py-2 text-sm"
          />
          <datalist id={`${id}-columns`}>
            {knownColumns
              .filter((name) => !value.includes(name))
              .map((name) => (
                <option key={name} value={name} />
              ))}
          </datalist>
          <Button
            variant="secondary"
            onClick={() => {
              add(draft);
              setDraft('');
            }}
            disabled={!draft.trim()}
          >
            Add
          </Button>
        </div>
      )}
      {error && (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-signal-700">
          {error}
        </p>
      )}
    </fieldset>
  );
}
