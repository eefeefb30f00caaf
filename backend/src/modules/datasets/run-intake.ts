import { Worker } from 'node:worker_threads';
import { AppError } from '../../lib/errors';
import type { IntakeLimits } from './parsing/build-table';
import { IntakeError, type IntakeErrorStatus } from './parsing/intake-error';
import { parseUpload } from './parsing/parse-upload';
import { type PreparedDataset, prepareForStorage } from './prepare-storage';

export type IntakeResult = {
  format: 'xlsx' | 'csv';
  warnings: string[];
  sheetName: string | null;
  sheetNames: string[];
  columnCount: number;
  prepared: PreparedDataset;
};

type WorkerAnswer =
  | ({ ok: true } & IntakeResult)
  | { ok: false; code: string; status: IntakeErrorStatus; message: string; details?: unknown }
  | { ok: false; unexpected: string };

const WORKER_URL = new URL('./intake-worker.mjs', import.meta.url);

/**
 * Parses, profiles and prepares an upload in a worker thread, so that a 100k-row export does not
 * hold up other requests. The workbook reader inside it runs in a worker of its own.
 */
export function runIntake(input: {
  bytes: Uint8Array;
  sheet?: string;
  limits?: Partial<IntakeLimits>;
  secret: string;
}): Promise<IntakeResult> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(WORKER_URL, {
      workerData: { bytes: input.bytes, sheet: input.sheet, limits: input.limits, secret: input.secret },
    });
    let settled = false;
    const finish = (action: () => void) => {
      if (settled) return;
      settled = true;
      void worker.terminate();
      action();
    };
    worker.once('message', (answer: WorkerAnswer) =>
      finish(() => {
        if (answer.ok) {
          const { ok: _ok, ...result } = answer;
          resolve(result);
        } else if ('unexpected' in answer) {
          reject(new Error(`intake worker failed: ${answer.unexpected}`));
        } else {
          reject(new IntakeError(answer.code, answer.status, answer.message, answer.details));
        }
      }),
    );
    worker.once('error', (error) => finish(() => reject(error)));
    worker.once('exit', (code) =>
      finish(() =>
        reject(new AppError('internal', 500, `The upload could not be read (reader exit ${code}).`)),
      ),
    );
  });
}

/** Files up to this size are read on the request path: a worker costs more than they do. */
export const INLINE_MAX_BYTES = 512 * 1024;

type IntakeInput = Parameters<typeof runIntake>[0];

export async function readInline(input: IntakeInput): Promise<IntakeResult> {
  const parsed = await parseUpload(input.bytes, { sheet: input.sheet, limits: input.limits });
  return {
    format: parsed.format,
    warnings: parsed.warnings,
    sheetName: parsed.sheetName,
    sheetNames: parsed.sheetNames,
    columnCount: parsed.profile.length,
    prepared: prepareForStorage(parsed, input.secret),
  };
}

/** Reads an upload: small files in place, larger ones in a worker thread. */
export function readUpload(input: IntakeInput, inlineMaxBytes = INLINE_MAX_BYTES): Promise<IntakeResult> {
  return input.bytes.byteLength <= inlineMaxBytes ? readInline(input) : runIntake(input);
}
