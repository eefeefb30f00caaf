// Worker thread entry: parses, profiles and prepares one upload away from the server's event loop.
import { parentPort, workerData } from 'node:worker_threads';
import type { IntakeLimits } from './parsing/build-table';
import { IntakeError } from './parsing/intake-error';
import { parseReadWorkbook, parseUpload } from './parsing/parse-upload';
import type { WorkbookRead } from './parsing/parse-xlsx';
import { prepareForStorage } from './prepare-storage';

/** Either the upload's bytes, or a workbook whose sheet the reader has read already. */
type Job = {
  bytes?: Uint8Array;
  workbook?: WorkbookRead;
  sheet?: string;
  limits?: Partial<IntakeLimits>;
  secret: string;
};

async function run(job: Job) {
  try {
    const parsed = job.workbook
      ? parseReadWorkbook(job.workbook, { limits: job.limits })
      : await parseUpload(job.bytes ?? new Uint8Array(), { sheet: job.sheet, limits: job.limits });
    const prepared = prepareForStorage(parsed, job.secret);
    parentPort?.postMessage({
      ok: true,
      format: parsed.format,
      warnings: parsed.warnings,
      sheetName: parsed.sheetName,
      sheetNames: parsed.sheetNames,
      columnCount: parsed.profile.length,
      prepared,
    });
  } catch (error) {
    if (error instanceof IntakeError) {
      parentPort?.postMessage({
        ok: false,
        code: error.code,
        status: error.status,
        message: error.message,
        details: error.details,
      });
    } else {
      parentPort?.postMessage({ ok: false, unexpected: String((error as Error)?.stack ?? error) });
    }
  }
}

void run(workerData as Job);
