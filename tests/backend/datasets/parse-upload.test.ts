import { zipSync } from 'fflate';
import iconv from 'iconv-lite';
import { describe, expect, it } from 'vitest';
import { IntakeError } from '../../../backend/src/modules/datasets/parsing/intake-error';
import { parseUpload } from '../../../backend/src/modules/datasets/parsing/parse-upload';
import { csvBytes, encryptedWorkbookBytes, workbookBytes } from './workbook-fixtures';

async function rejection(promise: Promise<unknown>): Promise<IntakeError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof IntakeError) return error;
    throw error;
  }
  throw new Error('expected the upload to be rejected');
}

const SMALL_CSV =
  'Staff No,Crew,Weekly Overtime Hours,Start Date\nQF-0001,Crew A,2.5,2024-01-15\nQF-0002,Crew B,0,2023-06-01\n';

describe('reading an upload by its content', () => {
  it('reads a UTF-8 CSV into typed columns', async () => {
    const parsed = await parseUpload(csvBytes(SMALL_CSV));
    expect(parsed.format).toBe('csv');
    expect(parsed.profile.map((c) => [c.name, c.type])).toEqual([
      ['Staff No', 'identifier'],
      ['Crew', 'category'],
      ['Weekly Overtime Hours', 'number'],
      ['Start Date', 'date'],
    ]);
    expect(parsed.table.columns[2].values).toEqual([2.5, 0]);
    expect(parsed.table.rowNumbers).toEqual([2, 3]);
  });

  it('strips a UTF-8 byte-order mark from the first header', async () => {
    const parsed = await parseUpload(new Uint8Array([0xef, 0xbb, 0xbf, ...csvBytes(SMALL_CSV)]));
    expect(parsed.profile[0].name).toBe('Staff No');
    expect(parsed.warnings).toEqual([]);
  });

  it('converts a Windows-1252 CSV with semicolons and decimal commas, and says so', async () => {
    const text = 'Staff No;Depot;Engagement Score\nQF-1;Café Row;3,5\nQF-2;Señor Lane;4,25\n';
    const parsed = await parseUpload(new Uint8Array(iconv.encode(text, 'win1252')));
    expect(parsed.table.columns[1].values).toEqual(['Café Row', 'Señor Lane']);
    expect(parsed.table.columns[2].values).toEqual([3.5, 4.25]);
    expect(parsed.warnings.join(' ')).toMatch(/Windows-1252/);
    expect(parsed.warnings.join(' ')).toMatch(/semicolon/);
  });

  it('converts a UTF-16 CSV with a byte-order mark, tab separated', async () => {
    const text = 'Staff No\tCrew\nQF-1\tNorth ñ\nQF-2\tSouth\n';
    const bytes = new Uint8Array([0xff, 0xfe, ...Buffer.from(text, 'utf16le')]);
    const parsed = await parseUpload(bytes);
    expect(parsed.table.columns[1].values).toEqual(['North ñ', 'South']);
    expect(parsed.warnings.join(' ')).toMatch(/UTF-16LE/);
  });

  it('refuses UTF-16 without a byte-order mark, images and other binaries with 415', async () => {
    const noBom = new Uint8Array(Buffer.from('a,b\n1,2\n', 'utf16le'));
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
    for (const bytes of [noBom, png]) {
      const error = await rejection(parseUpload(bytes));
      expect([error.status, error.code]).toEqual([415, 'unsupported_file_type']);
      expect(error.message).toMatch(/CSV UTF-8/);
    }
  });

  it('refuses an empty file and a file of blank lines', async () => {
    for (const bytes of [new Uint8Array(), csvBytes('\n\n  \n')]) {
      const error = await rejection(parseUpload(bytes));
      expect([error.status, error.code]).toEqual([422, 'file_empty']);
    }
  });

  it('refuses a header with no rows under it', async () => {
    const error = await rejection(parseUpload(csvBytes('Staff No,Crew\n\n')));
    expect([error.status, error.code]).toEqual([422, 'no_rows']);
  });

  it('names blank, duplicated and over-long header columns', async () => {
    const long = 'x'.repeat(101);
    const error = await rejection(parseUpload(csvBytes(`Staff No,,Crew,crew,${long}\n1,2,3,4,5\n`)));
    expect([error.status, error.code]).toEqual([422, 'header_invalid']);
    const columns = (error.details as { columns: { column: string; reason: string }[] }).columns;
    expect(columns.map((c) => c.column)).toEqual(['B', 'D', 'E']);
    expect(error.message).toMatch(/column B \(2\): blank header/);
    expect(error.message).toMatch(/column D \(4\): same header as column C \(3\)/);
  });

  it('takes the first non-empty row as the header', async () => {
    const parsed = await parseUpload(csvBytes('\n,,\nStaff No,Crew\nQF-1,A\n'));
    expect(parsed.profile.map((c) => c.name)).toEqual(['Staff No', 'Crew']);
    expect(parsed.table.rowNumbers).toEqual([4]);
  });

  it('reports an unbalanced quote with its row number', async () => {
    const error = await rejection(parseUpload(csvBytes('Staff No,Crew\nQF-1,A\nQF-2,"B\nQF-3,C\n')));
    expect([error.status, error.code]).toEqual([422, 'csv_unbalanced_quotes']);
    expect(error.details).toEqual({
      rows: [{ row: 3, reason: expect.stringMatching(/closing quote/) }],
      count: 1,
    });
  });

  it('lists rows with more values than the header, first 50 and a count', async () => {
    const rows = Array.from({ length: 60 }, (_, i) => `QF-${i},A,extra`).join('\n');
    const error = await rejection(parseUpload(csvBytes(`Staff No,Crew\n${rows}\n`)));
    expect([error.status, error.code]).toEqual([422, 'rows_invalid']);
    const details = error.details as { rows: { row: number }[]; count: number };
    expect(details.count).toBe(60);
    expect(details.rows).toHaveLength(50);
    expect(details.rows[0].row).toBe(2);
  });

  it('lists values that do not fit their column, with row and column', async () => {
    const rows = Array.from(
      { length: 30 },
      (_, i) => `QF-${i},${i === 7 ? 'soon' : '2024-02-01'},${i === 9 ? 'lots' : i}`,
    );
    const error = await rejection(
      parseUpload(csvBytes(`Staff No,Start Date,Training Days\n${rows.join('\n')}\n`)),
    );
    expect([error.status, error.code]).toEqual([422, 'rows_invalid']);
    expect(error.details).toEqual({
      rows: [
        { row: 9, column: 'Start Date', reason: '"soon" is not a date' },
        { row: 11, column: 'Training Days', reason: '"lots" is not a number' },
      ],
      count: 2,
    });
  });

  it('refuses too many rows and too many columns with 413 (limits configurable)', async () => {
    const rows = await rejection(parseUpload(csvBytes('a,b\n1,2\n3,4\n5,6\n'), { limits: { maxRows: 2 } }));
    expect([rows.status, rows.code]).toEqual([413, 'too_many_rows']);
    const columns = await rejection(parseUpload(csvBytes('a,b,c\n1,2,3\n'), { limits: { maxColumns: 2 } }));
    expect([columns.status, columns.code]).toEqual([413, 'too_many_columns']);
  });
});

// Every case twice: read in one go, and read in parts of 64 bytes of sheet XML (a part per row
// or so), as large sheets are read (see xlsx-worker.mjs).
describe.each([
  ['in one read', {}],
  ['in parts', { workbookPartBytes: 64 }],
])('reading a workbook %s', (_label, parts) => {
  it('reads the first sheet with data, lists the others, and keeps cached formula values', async () => {
    const bytes = workbookBytes([
      { name: 'Notes', rows: [] },
      {
        name: 'Staff',
        rows: [
          ['Staff No', 'Overtime', 'Start Date', 'Agency'],
          ['QF-1', { t: 'n', f: '1+1', v: 2 }, 45658, true],
          ['QF-2', 3, 45717, false],
        ],
        dateCells: ['C2', 'C3'],
      },
      { name: 'Lookup', rows: [['x'], [1]] },
    ]);
    const parsed = await parseUpload(bytes, { limits: parts });
    expect(parsed.format).toBe('xlsx');
    expect(parsed.sheetName).toBe('Staff');
    expect(parsed.sheetNames).toEqual(['Notes', 'Staff', 'Lookup']);
    expect(parsed.warnings.join(' ')).toMatch(/also has: Notes, Lookup/);
    expect(parsed.table.columns[1].values).toEqual([2, 3]);
    // ECMA-376 Part 1, 1900 date system (from memory): 45658 = 2025-01-01.
    expect(parsed.table.columns[2].values).toEqual(['2025-01-01', '2025-03-01']);
    expect(parsed.profile[3].type).toBe('yes-no');
  });

  it('reads another sheet when the analyst names it, and says which exist when the name is wrong', async () => {
    const bytes = workbookBytes([
      { name: 'Staff', rows: [['Staff No'], ['QF-1']] },
      {
        name: 'Leavers',
        rows: [
          ['Staff No', 'Reason'],
          ['QF-9', 'Resignation'],
        ],
      },
    ]);
    const parsed = await parseUpload(bytes, { sheet: 'Leavers', limits: parts });
    expect(parsed.profile.map((c) => c.name)).toEqual(['Staff No', 'Reason']);
    const error = await rejection(parseUpload(bytes, { sheet: 'Nope', limits: parts }));
    expect([error.status, error.code]).toEqual([422, 'sheet_not_found']);
    expect(error.message).toMatch(/Staff, Leavers/);
  });

  it('refuses merged cells, naming the ranges', async () => {
    const bytes = workbookBytes([
      {
        name: 'Staff',
        rows: [
          ['Staff No', 'Crew'],
          ['QF-1', 'A'],
        ],
        merges: ['A1:B1'],
      },
    ]);
    const error = await rejection(parseUpload(bytes, { limits: parts }));
    expect([error.status, error.code]).toEqual([422, 'merged_cells']);
    expect(error.message).toMatch(/A1:B1/);
  });

  it('refuses a password-protected workbook with a clear message', async () => {
    const error = await rejection(parseUpload(encryptedWorkbookBytes(), { limits: parts }));
    expect([error.status, error.code]).toEqual([422, 'workbook_encrypted']);
    expect(error.message).toMatch(/remove the password/);
  });

  it('refuses a zip that is not a workbook with 415', async () => {
    const bytes = zipSync({ 'word/document.xml': new TextEncoder().encode('<w/>') });
    const error = await rejection(parseUpload(bytes, { limits: parts }));
    expect([error.status, error.code]).toEqual([415, 'unsupported_file_type']);
  });

  it('refuses a zip bomb from its directory, before decompressing anything', async () => {
    const zeros = new Uint8Array(16 * 1024 * 1024);
    const bomb = zipSync(
      { 'xl/workbook.xml': new TextEncoder().encode('<workbook/>'), 'xl/worksheets/sheet1.xml': zeros },
      { level: 9 },
    );
    const started = performance.now();
    const error = await rejection(parseUpload(bomb, { limits: parts }));
    expect([error.status, error.code]).toEqual([413, 'workbook_too_large']);
    expect(error.message).toMatch(/zip bomb/);
    // Not a speed goal: only shows that no worker was started (that alone takes longer).
    expect(performance.now() - started).toBeLessThan(1000);
  });

  it('refuses a workbook that unpacks beyond the configured size', async () => {
    const bytes = workbookBytes([{ name: 'Staff', rows: [['Staff No'], ['QF-1']] }]);
    const error = await rejection(parseUpload(bytes, { limits: { ...parts, maxUncompressedBytes: 1000 } }));
    expect([error.status, error.code]).toEqual([413, 'workbook_too_large']);
  });

  it('refuses a damaged workbook', async () => {
    const bytes = workbookBytes([{ name: 'Staff', rows: [['Staff No'], ['QF-1']] }]).slice(0, 200);
    const error = await rejection(parseUpload(bytes, { limits: parts }));
    expect([error.status, error.code]).toEqual([422, 'workbook_unreadable']);
  });

  it('refuses too many rows inside the worker (limit configurable)', async () => {
    const rows = [['Staff No'], ...Array.from({ length: 300 }, (_, i) => [`QF-${i}`])];
    const error = await rejection(
      parseUpload(workbookBytes([{ name: 'Staff', rows }]), { limits: { ...parts, maxRows: 100 } }),
    );
    expect([error.status, error.code]).toEqual([413, 'too_many_rows']);
  });

  it('abandons a workbook that takes longer than the time limit', async () => {
    const rows = [['Staff No'], ...Array.from({ length: 50 }, (_, i) => [`QF-${i}`])];
    const error = await rejection(
      parseUpload(workbookBytes([{ name: 'Staff', rows }]), { limits: { ...parts, workbookTimeoutMs: 1 } }),
    );
    expect([error.status, error.code]).toEqual([413, 'workbook_too_slow']);
  });
});
