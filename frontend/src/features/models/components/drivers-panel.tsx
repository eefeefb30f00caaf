import { useId, useState } from 'react';
import type { ModelDriver } from '../../../../../shared/models';
import { Button } from '../../../components/button';
import { ErrorNotice } from '../../../components/error-notice';

export type DriversPanelProps = {
  drivers: readonly ModelDriver[];
  /** false once the run is with the privacy officers, or for readers who cannot edit */
  editable: boolean;
  onSave: (feature: string, text: string) => Promise<unknown>;
};

function DriverRow({
  driver,
  editable,
  onSave,
}: { driver: ModelDriver } & Omit<DriversPanelProps, 'drivers'>) {
  const id = useId();
  const [text, setText] = useState(driver.suggestedAction);
  const [state, setState] = useState<'idle' | 'saving' | 'saved'>('idle');
  const [error, setError] = useState<unknown>(null);
  const save = async () => {
    setState('saving');
    setError(null);
    try {
      await onSave(driver.feature, text.trim());
      setState('saved');
    } catch (e) {
      setError(e);
      setState('idle');
    }
  };
  return (
    <li className="rounded-lg border border-sand-200 bg-white p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="font-semibold text-slate-900">{driver.feature}</h3>
        <span className="text-sm tabular-nums text-slate-600">
          importance {Math.round(driver.importance * 100)}%
        </span>
      </div>
      <p className="mt-1 text-sm text-slate-700">{driver.direction}</p>
      <label htmlFor={id} className="mt-3 block text-sm font-medium text-slate-800">
        Suggested action for managers ({driver.feature})
      </label>
      <textarea
        id={id}
        rows={2}
        value={text}
        disabled={!editable}
        onChange={(e) => {
          setText(e.target.value);
          setState('idle');
        }}
        placeholder="e.g. review overtime allocation on van routes"
        className="mt-1 block w-full rounded-md border border-slate-300 px-3 py-2 text-sm disabled:bg-slate-100"
      />
      {editable && (
        <div className="mt-2 flex items-center gap-3">
          <Button size="sm" variant="secondary" busy={state === 'saving'} onClick={save}>
            Save action
          </Button>
          {state === 'saved' && (
            <span role="status" className="text-sm text-moss-800">
              Saved
            </span>
          )}
        </div>
      )}
      {error ? <ErrorNotice error={error} title="The action was not saved" /> : null}
    </li>
  );
}

/** Each driver's importance and direction, and the action the analyst suggests to managers. */
export function DriversPanel({ drivers, editable, onSave }: DriversPanelProps) {
  if (drivers.length === 0)
    return <p className="text-sm text-slate-600">The tree made no splits: no drivers.</p>;
  return (
    <ul className="space-y-3">
      {drivers.map((d) => (
        <DriverRow key={d.feature} driver={d} editable={editable} onSave={onSave} />
      ))}
    </ul>
  );
}
