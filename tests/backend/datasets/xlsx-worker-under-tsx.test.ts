import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';

const run = promisify(execFile);

describe('the upload readers under tsx (as vitest and the scripts run them; the server runs built)', () => {
  it('start their workers and read a workbook', async () => {
    const script = `
      import { generateQuillfernExport } from './backend/src/demo/quillfern';
      import { quillfernXlsx } from './backend/src/demo/quillfern-xlsx';
      import { readUpload } from './backend/src/modules/datasets/run-intake';
      const bytes = quillfernXlsx(generateQuillfernExport({ rows: 30, seed: 1 }));
      readUpload({ bytes, secret: 's'.repeat(40) }, 0).then((read) => {
        console.log(JSON.stringify({ format: read.format, rows: read.prepared.rowNumbers.length, sheet: read.sheetName }));
      });
    `;
    const { stdout } = await run('node_modules/.bin/tsx', ['--eval', script], {
      cwd: process.cwd(),
      timeout: 60_000,
    });
    expect(JSON.parse(stdout.trim().split('\n').at(-1) ?? '')).toEqual({
      format: 'xlsx',
      rows: 30,
      sheet: 'Staff',
    });
  });
});
