import { Worker } from 'node:worker_threads';
import { type Cell, type IntakeLimits, normaliseCell, type RawTable, tableFromGrid } from './build-table';
import { IntakeError, type IntakeErrorStatus } from './intake-error';
import { checkZipSizes } from './zip-guard';

type WorkerResult =
  | WorkbookRead
  | { ok: false; code: string; status: IntakeErrorStatus; message: string; details?: unknown };

/** A sheet as the throw-away reader sends it back: typed-array columns (movable between threads). */
export type WorkbookRead = {
  ok: true;
  sheetName: string;
  sheetNames: string[];
  /** per column and row, one of KIND */
  kinds: Uint8Array[];
  /** the number (or date serial), or for text the index into `texts` of the column */
  values: Float64Array[];
  texts: string[][];
  height: number;
  errorCells: number;
  /** how many parts the sheet was read in (1: in one read; see xlsx-worker.mjs) */
  parts: number;
};

// Cell kinds as xlsx-worker.mjs writes them.
const KIND = { empty: 0, number: 1, dateSerial: 2, text: 3, true: 4, false: 5 } as const;

// A plain JavaScript module, so that the same file runs from the sources (tsx, vitest) and beside the
// built server (scripts/build-server.mjs copies it into dist/server).
const WORKER_URL = new URL('./xlsx-worker.mjs', import.meta.url);

/** The worker's typed-array columns as cells, with a mask of the number cells that carry a date format. */
function decodeColumns(result: WorkbookRead): {
  columns: Cell[][];
  masks: Uint8Array[];
} {
  const columns: Cell[][] = [];
  const masks: Uint8Array[] = [];
  for (let c = 0; c < result.kinds.length; c += 1) {
    const kinds = result.kinds[c];
    const values = result.values[c];
    // Trimmed once per distinct text rather than once per cell, as tableFromGrid would.
    const texts = (result.texts[c] ?? []).map((text) =>
      typeof text === 'string' ? normaliseCell(text) : null,
    );
    const column = new Array<Cell>(result.height);
    const mask = new Uint8Array(result.height);
    for (let r = 0; r < result.height; r += 1) {
      switch (kinds[r]) {
        case KIND.number:
          column[r] = Number.isFinite(values[r]) ? values[r] : null;
          break;
        case KIND.dateSerial:
          column[r] = Number.isFinite(values[r]) ? values[r] : null;
          mask[r] = 1;
          break;
        case KIND.text:
          column[r] = texts[values[r]] ?? null;
          break;
        case KIND.true:
          column[r] = true;
          break;
        case KIND.false:
          column[r] = false;
          break;
        default:
          column[r] = null;
      }
    }
    columns.push(column);
    masks.push(mask);
  }
  return { columns, masks };
}

function runWorker(
  bytes: Uint8Array,
  sheet: string | undefined,
  limits: IntakeLimits,
  handOverBytes: boolean,
): Promise<WorkerResult> {
  return new Promise((resolve, reject) => {
    const worker = new Worker(WORKER_URL, {
      workerData: {
        bytes,
        sheet,
        maxRows: limits.maxRows,
        maxColumns: limits.maxColumns,
        partBytes: limits.workbookPartBytes,
      },
      // A small young generation: more frequent minor collections, about 20 MB less at the peak.
      resourceLimits: { maxOldGenerationSizeMb: limits.workbookHeapMb, maxYoungGenerationSizeMb: 8 },
      // Moved rather than copied when the caller is done with them (and they fill their buffer).
      transferList:
        handOverBytes && bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength
          ? [bytes.buffer as ArrayBuffer]
          : [],
      // A plain module: it needs none of the TypeScript loader the process may have been started with.
      execArgv: [],
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
 * Reads an XLSX workbook's sheet: size checks on the zip directory first, then the xlsx package
 * inside a throw-away worker with time, memory, row and column limits. `sheet` picks a sheet by
 * name; by default the first sheet with data. The result's arrays can move to another thread.
 */
export async function readWorkbook(
  bytes: Uint8Array,
  limits: IntakeLimits,
  options: { sheet?: string; handOverBytes?: boolean } = {},
): Promise<WorkbookRead> {
  checkZipSizes(bytes, limits);
  const result = await runWorker(bytes, options.sheet, limits, options.handOverBytes === true);
  if (!result.ok) throw new IntakeError(result.code, result.status, result.message, result.details);
  return result;
}

/** The transferable arrays of a read sheet, for a worker's transfer list. */
export function workbookBuffers(read: WorkbookRead): ArrayBuffer[] {
  return [...read.kinds, ...read.values].map((array) => array.buffer as ArrayBuffer);
}

/** A read sheet as a table: the first non-empty row is the header (see tableFromGrid). */
export function tableFromWorkbook(result: WorkbookRead, limits: IntakeLimits): RawTable {
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
  const { columns, masks } = decodeColumns(result);
  return tableFromGrid(columns, result.height, limits, {
    dateMasks: masks,
    normalised: true,
    sheetName: result.sheetName,
    sheetNames: result.sheetNames,
    warnings,
  });
}

/** Reads an XLSX workbook into a table (readWorkbook, then tableFromWorkbook). */
export async function parseXlsx(
  bytes: Uint8Array,
  limits: IntakeLimits,
  options: { sheet?: string } = {},
): Promise<RawTable> {
  return tableFromWorkbook(await readWorkbook(bytes, limits, options), limits);
}
