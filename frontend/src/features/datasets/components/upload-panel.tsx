import { type DragEvent, useId, useRef, useState } from 'react';
import type { DatasetUploadResponse } from '../../../../../shared/datasets';
import { Button } from '../../../components/button';
import { Card } from '../../../components/card';
import { ProgressBar } from '../../../components/progress-bar';
import { useUploadDataset } from '../api/upload-dataset';
import { IntakeProblems } from './intake-problems';

export type UploadPanelProps = {
  onUploaded: (dataset: DatasetUploadResponse) => void;
};

/** Drag a staff export here or choose it; shows upload progress, then the server's check, then errors in place. */
export function UploadPanel({ onUploaded }: UploadPanelProps) {
  const inputId = useId();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [dragging, setDragging] = useState(false);
  const [sheet, setSheet] = useState('');
  const sheetId = useId();
  const upload = useUploadDataset();

  function start(chosen: File | undefined) {
    if (!chosen) return;
    setFile(chosen);
    upload.mutate({ file: chosen, sheet }, { onSuccess: onUploaded });
  }

  function onDrop(event: DragEvent<HTMLDivElement>) {
    event.preventDefault();
    setDragging(false);
    if (!upload.isPending) start(event.dataTransfer.files[0]);
  }

  return (
    <Card title="Upload a staff export">
      <section
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        aria-label="Drop the staff export here"
        data-testid="upload-drop-zone"
        className={`rounded-lg border-2 border-dashed px-6 py-8 text-center ${dragging ? 'border-moss-500 bg-moss-50' : 'border-sand-300 bg-sand-50'}`}
      >
        <p className="text-slate-700">Drop an .xlsx or .csv file here, or</p>
        <label htmlFor={inputId} className="sr-only">
          Staff export file
        </label>
        <input
          ref={input}
          id={inputId}
          type="file"
          accept=".xlsx,.csv,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
          className="sr-only"
          onChange={(event) => {
            start(event.target.files?.[0]);
            event.target.value = '';
          }}
        />
        <Button
          className="mt-3"
          variant="secondary"
          disabled={upload.isPending}
          onClick={() => input.current?.click()}
        >
          Choose a file
        </Button>
        <p className="mt-3 text-xs text-slate-500">
          One row per employee, the header in the first row. Names, personal e-mail addresses, phone numbers
          and national IDs are dropped before anything is stored; employee IDs are replaced by a keyed hash.
        </p>
      </section>
      <div className="mt-3 max-w-sm">
        <label htmlFor={sheetId} className="block text-sm font-medium text-slate-800">
          Sheet (workbooks only, optional)
        </label>
        <p className="text-xs text-slate-500">By default the first sheet with data is read.</p>
        <input
          id={sheetId}
          value={sheet}
          onChange={(event) => setSheet(event.target.value)}
          className="mt-1 block w-full rounded-md border border-slate-300 bg-white px-3 py-2 text-sm"
        />
      </div>
      <div className="mt-4 space-y-3" aria-live="polite">
        {upload.isPending && upload.phase === 'uploading' && (
          <ProgressBar value={upload.progress} label={`Uploading ${file?.name ?? 'the file'}`} />
        )}
        {upload.isPending && upload.phase === 'checking' && (
          <ProgressBar label="Reading and checking the file" phase="parsing, profiling and storing" />
        )}
        {upload.isError && (
          <IntakeProblems error={upload.error} title={`${file?.name ?? 'The file'} was not uploaded`} />
        )}
      </div>
    </Card>
  );
}
