import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';

const run = promisify(execFile);

describe('the workbook reader under tsx (how the server runs)', () => {
  it('starts its worker and reads a workbook', async () => {
    const script = `
      import { generateQuillfernExport } from './backend/src/demo/quillfern';
      import { quillfernXlsx } from './backend/src/demo/quillfern-xlsx';
      import { parseUpload } from './backend/src/modules/datasets/parsing/parse-upload';
      parseUpload(quillfernXlsx(generateQuillfernExport({ rows: 30, seed: 1 }))).then((parsed) => {
        console.log(JSON.stringify({ format: parsed.format, rows: parsed.table.rowNumbers.length, sheet: parsed.sheetName }));
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
