import { AppError } from '../../lib/errors';
import { startWorker } from '../../lib/start-worker';
import { DEFAULT_LIMITS, type IntakeLimits } from './parsing/build-table';
import { looksLikeZip } from './parsing/detect-format';
import { IntakeError, type IntakeErrorStatus } from './parsing/intake-error';
import { parseUpload } from './parsing/parse-upload';
import { readWorkbook, type WorkbookRead, workbookBuffers } from './parsing/parse-xlsx';
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

/**
 * Parses, profiles and prepares an upload in a worker thread, so that a 100k-row export does not
 * hold up other requests. A workbook's sheet is read first by the throw-away xlsx reader (a worker
 * of its own); the intake worker starts only once the reader is gone, so the two never hold
 * memory at the same time, and the sheet's arrays move to it rather than being copied.
 */
export async function runIntake(input: {
  bytes: Uint8Array;
  sheet?: string;
  limits?: Partial<IntakeLimits>;
  secret: string;
  /** the caller is done with `bytes`: a workbook's bytes move to the reader instead of being copied */
  handOverBytes?: boolean;
}): Promise<IntakeResult> {
  if (looksLikeZip(input.bytes)) {
    const workbook = await readWorkbook(
      input.bytes,
      { ...DEFAULT_LIMITS, ...input.limits },
      { sheet: input.sheet, handOverBytes: input.handOverBytes },
    );
    return inIntakeWorker(
      { workbook, limits: input.limits, secret: input.secret },
      workbookBuffers(workbook),
    );
  }
  return inIntakeWorker({
    bytes: input.bytes,
    sheet: input.sheet,
    limits: input.limits,
    secret: input.secret,
  });
}

function inIntakeWorker(
  job: {
    bytes?: Uint8Array;
    workbook?: WorkbookRead;
    sheet?: string;
    limits?: Partial<IntakeLimits>;
    secret: string;
  },
  transferList: ArrayBuffer[] = [],
): Promise<IntakeResult> {
  return new Promise((resolve, reject) => {
    const worker = startWorker(import.meta.url, 'intake-worker', { workerData: job, transferList });
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
