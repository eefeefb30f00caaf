import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import XLSX from 'xlsx';
import { DEFAULT_LIMITS, type IntakeLimits } from '../../../backend/src/modules/datasets/parsing/build-table';
import { readWorkbook, type WorkbookRead } from '../../../backend/src/modules/datasets/parsing/parse-xlsx';
import { workbookAround } from '../../helpers/hostile-files';

// A large sheet is read in parts (xlsx-worker.mjs): the rows are cut into pieces of about
// `workbookPartBytes` of XML and each piece is read on its own. These tests force tiny parts on
// small workbooks and hold the result to what one read of the whole workbook gives.

const WHOLE: IntakeLimits = { ...DEFAULT_LIMITS, workbookPartBytes: Number.MAX_SAFE_INTEGER };

function inParts(partBytes: number): IntakeLimits {
  return { ...DEFAULT_LIMITS, workbookPartBytes: partBytes };
}

/** What the reader found, without how it read it. */
function content(read: WorkbookRead) {
  const { parts: _parts, ...rest } = read;
  return rest;
}

type CellSpec =
  | { kind: 'blank' }
  | { kind: 'number'; value: number }
  | { kind: 'date'; value: number }
  | { kind: 'text'; value: string }
  | { kind: 'bool'; value: boolean }
  | { kind: 'error' };

const cellSpec: fc.Arbitrary<CellSpec> = fc.oneof(
  fc.constant({ kind: 'blank' as const }),
  fc.record({ kind: fc.constant('number' as const), value: fc.double({ min: -1e9, max: 1e9, noNaN: true }) }),
  fc.record({ kind: fc.constant('date' as const), value: fc.integer({ min: 1, max: 60_000 }) }),
  // Markup characters and text that looks like a row tag must stay inside their cells.
  fc.record({
    kind: fc.constant('text' as const),
    value: fc.oneof(
      fc.string({ maxLength: 12 }),
      fc.constantFrom('<row r="9">', 'a & b', '</sheetData>', 'Zoë ✓'),
    ),
  }),
  fc.record({ kind: fc.constant('bool' as const), value: fc.boolean() }),
  fc.constant({ kind: 'error' as const }),
);

function sheetOf(rows: CellSpec[][]): XLSX.WorkSheet {
  const sheet: XLSX.WorkSheet = {};
  let width = 1;
  rows.forEach((row, r) => {
    width = Math.max(width, row.length);
    row.forEach((spec, c) => {
      const address = XLSX.utils.encode_cell({ r, c });
      if (spec.kind === 'number') sheet[address] = { t: 'n', v: spec.value };
      if (spec.kind === 'date') sheet[address] = { t: 'n', v: spec.value, z: 'dd/mm/yyyy' };
      if (spec.kind === 'text') sheet[address] = { t: 's', v: spec.value };
      if (spec.kind === 'bool') sheet[address] = { t: 'b', v: spec.value };
      if (spec.kind === 'error') sheet[address] = { t: 'e', v: 0x2a };
    });
  });
  sheet['!ref'] = XLSX.utils.encode_range({
    s: { r: 0, c: 0 },
    e: { r: Math.max(0, rows.length - 1), c: width - 1 },
  });
  return sheet;
}

function bookBytes(sheets: Array<[string, XLSX.WorkSheet]>, sharedStrings: boolean): Uint8Array {
  const book = XLSX.utils.book_new();
  for (const [name, sheet] of sheets) XLSX.utils.book_append_sheet(book, sheet, name);
  return new Uint8Array(XLSX.write(book, { type: 'buffer', bookType: 'xlsx', bookSST: sharedStrings }));
}

describe('reading a large sheet in parts', () => {
  it('gives exactly what one read of the whole workbook gives (random sheets, random part sizes)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.array(cellSpec, { maxLength: 7 }), { minLength: 3, maxLength: 40 }),
        fc.boolean(),
        fc.boolean(),
        fc.integer({ min: 1, max: 400 }),
        async (rows, emptyFirstSheet, sharedStrings, partBytes) => {
          // A header row with text, so that the sheet has data to find.
          const withHeader: CellSpec[][] = [[{ kind: 'text', value: 'Staff No' }], ...rows];
          const sheets: Array<[string, XLSX.WorkSheet]> = [];
          if (emptyFirstSheet) sheets.push(['Notes', {}]);
          sheets.push(['Staff', sheetOf(withHeader)], ['Lookup', sheetOf([[{ kind: 'number', value: 1 }]])]);
          const bytes = bookBytes(sheets, sharedStrings);
          const whole = await readWorkbook(bytes, WHOLE);
          const parts = await readWorkbook(bytes, inParts(partBytes));
          expect(whole.parts).toBe(1);
          expect(parts.sheetName).toBe('Staff');
          expect(content(parts)).toEqual(content(whole));
          // With parts this small, every written row after the first starts a part of its own.
          const writtenRows = rows.filter((row) => row.some((cell) => cell.kind !== 'blank')).length;
          return writtenRows === 0 || partBytes > 40 || parts.parts > 1;
        },
      ),
      { numRuns: 25, seed: 20261202 },
    );
  });

  it('cuts a 2,000-row sheet into parts, and finds the same cells', async () => {
    const rows = [
      ['Staff No', 'Crew', 'Weekly Overtime Hours', 'Start Date', 'Agency'],
      ...Array.from({ length: 2000 }, (_, i) => [
        `QF-${i}`,
        `Crew ${i % 7}`,
        (i % 13) / 2,
        44_000 + i,
        i % 3 === 0,
      ]),
    ];
    const sheet = XLSX.utils.aoa_to_sheet(rows);
    for (let r = 1; r <= 2000; r += 1) sheet[XLSX.utils.encode_cell({ r, c: 3 })].z = 'yyyy-mm-dd';
    const bytes = bookBytes([['Staff', sheet]], true);
    const whole = await readWorkbook(bytes, WHOLE);
    const parts = await readWorkbook(bytes, inParts(4096));
    expect(parts.parts).toBeGreaterThan(10);
    expect(content(parts)).toEqual(content(whole));
    expect(parts.height).toBe(2001);
    expect(parts.kinds[3].filter((kind) => kind === 2)).toHaveLength(2000); // date serials
  });

  it('reads the sheet the analyst names, in parts', async () => {
    const staff = XLSX.utils.aoa_to_sheet([
      ['Staff No'],
      ...Array.from({ length: 50 }, (_, i) => [`QF-${i}`]),
    ]);
    const leavers = XLSX.utils.aoa_to_sheet([
      ['Staff No', 'Reason'],
      ...Array.from({ length: 50 }, (_, i) => [`QF-${i}`, 'Moved']),
    ]);
    const bytes = bookBytes(
      [
        ['Staff', staff],
        ['Leavers', leavers],
      ],
      false,
    );
    const parts = await readWorkbook(bytes, inParts(64), { sheet: 'Leavers' });
    expect(parts.parts).toBeGreaterThan(1);
    expect(content(parts)).toEqual(content(await readWorkbook(bytes, WHOLE, { sheet: 'Leavers' })));
    expect(parts.sheetName).toBe('Leavers');
  });

  it('reads rows written with a namespace prefix in parts', async () => {
    const rows = Array.from(
      { length: 30 },
      (_, i) =>
        `<x:row r="${i + 1}"><x:c r="A${i + 1}" t="inlineStr"><x:is><x:t>QF-${i}</x:t></x:is></x:c><x:c r="B${i + 1}"><x:v>${i}</x:v></x:c></x:row>`,
    ).join('');
    const bytes = workbookAround(
      `<?xml version="1.0"?><x:worksheet xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><x:sheetData>${rows}</x:sheetData></x:worksheet>`,
    );
    const whole = await readWorkbook(bytes, WHOLE);
    const parts = await readWorkbook(bytes, inParts(64));
    expect(whole.height).toBe(30);
    expect(parts.parts).toBeGreaterThan(1);
    expect(content(parts)).toEqual(content(whole));
  });

  it('falls back to one read when rows carry no numbers (a part could not say where it starts)', async () => {
    const rows = Array.from(
      { length: 30 },
      (_, i) => `<row><c t="inlineStr"><is><t>QF-${i}</t></is></c></row>`,
    ).join('');
    const bytes = workbookAround(
      `<?xml version="1.0"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${rows}</sheetData></worksheet>`,
    );
    const parts = await readWorkbook(bytes, inParts(64));
    expect(parts.parts).toBe(1);
    expect(parts.height).toBe(30);
    expect(content(parts)).toEqual(content(await readWorkbook(bytes, WHOLE)));
  });
});
