import { Worker } from 'node:worker_threads';
import { type Cell, type IntakeLimits, type RawTable, tableFromGrid } from './build-table';
import { IntakeError, type IntakeErrorStatus } from './intake-error';
import { checkZipSizes } from './zip-guard';

type WorkerResult =
  | {
      ok: true;
      sheetName: string;
      sheetNames: string[];
      columns: Cell[][];
      masks: Uint8Array[];
      height: number;
      errorCells: number;
    }
  | { ok: false; code: string; status: IntakeErrorStatus; message: string; details?: unknown };

// A plain JavaScript module so that the same file runs under tsx (the server), vitest and node.
const WORKER_URL = new URL('./xlsx-worker.mjs', import.meta.url);

function runWorker(
  bytes: Uint8Array,
  sheet: string | undefined,
  limits: IntakeLimits,
): Promise<WorkerResult> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(WORKER_URL, {
      workerData: { bytes, sheet, maxRows: limits.maxRows, maxColumns: limits.maxColumns },
      resourceLimits: { maxOldGenerationSizeMb: limits.workbookHeapMb },
      stdout: true,
      stderr: true,
    });
    let settled = false;
    const finish = (action: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      // Thrown away after every file, whatever happened.
      void worker.terminate();
      action();
    };
    const timer = setTimeout(() => {
      finish(() =>
        reject(
          new IntakeError(
            'workbook_too_slow',
            413,
            `The workbook took longer than ${Math.round(limits.workbookTimeoutMs / 1000)} s to read and was abandoned. Save it as CSV (or split it) and upload again.`,
          ),
        ),
      );
    }, limits.workbookTimeoutMs);
    worker.once('message', (result: WorkerResult) => finish(() => resolve(result)));
    worker.once('error', (error: Error & { code?: string }) => {
      finish(() =>
        reject(
          error.code === 'ERR_WORKER_OUT_OF_MEMORY'
            ? new IntakeError(
                'workbook_too_large',
                413,
                'The workbook needs too much memory to read. Save it as CSV (or split it) and upload again.',
              )
            : new IntakeError(
                'workbook_unreadable',
                422,
                'The workbook could not be read. Open it in your spreadsheet program, save it as .xlsx again and upload it.',
              ),
        ),
      );
    });
    worker.once('exit', (code) => {
      finish(() =>
        reject(
          new IntakeError(
            'workbook_unreadable',
            422,
            `The workbook reader stopped unexpectedly (exit ${code}).`,
          ),
        ),
      );
    });
  });
}

/**
 * Reads an XLSX workbook: size checks on the zip directory first, then the xlsx package inside a
 * throw-away worker with time, memory, row and column limits. `sheet` picks a sheet by name;
 * by default the first sheet with data.
 */
export async function parseXlsx(
  bytes: Uint8Array,
  limits: IntakeLimits,
  options: { sheet?: string } = {},
): Promise<RawTable> {
  checkZipSizes(bytes, limits);
  const result = await runWorker(bytes, options.sheet, limits);
  if (!result.ok) throw new IntakeError(result.code, result.status, result.message, result.details);

  const warnings: string[] = [];
  const others = result.sheetNames.filter((name) => name !== result.sheetName);
  if (others.length > 0) {
    warnings.push(`Read the sheet "${result.sheetName}"; the workbook also has: ${others.join(', ')}.`);
  }
  if (result.errorCells > 0) {
    warnings.push(
      `${result.errorCells} cell(s) held spreadsheet errors (such as #N/A or #DIV/0!) and were read as missing.`,
    );
  }
  return tableFromGrid(result.columns, result.height, limits, {
    dateMasks: result.masks,
    sheetName: result.sheetName,
    sheetNames: result.sheetNames,
    warnings,
  });
}
