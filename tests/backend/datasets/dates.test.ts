import { describe, expect, it } from 'vitest';
import {
  decideDateOrder,
  excelSerialToIso,
  type ParsedDateText,
  parseDateText,
  resolveDateText,
} from '../../../backend/src/modules/datasets/parsing/dates';
import { IntakeError } from '../../../backend/src/modules/datasets/parsing/intake-error';
import { parseUpload } from '../../../backend/src/modules/datasets/parsing/parse-upload';
import { csvBytes, workbookBytes } from './workbook-fixtures';

describe('Excel date serials (1900 date system)', () => {
  // ECMA-376 Part 1, 1900 date system; values from memory (as the checks document says).
  it('reads serial 1 as 1900-01-01, 59 as 1900-02-28, 61 as 1900-03-01 and 45658 as 2025-01-01', () => {
    expect(excelSerialToIso(1)).toBe('1900-01-01');
    expect(excelSerialToIso(59)).toBe('1900-02-28');
    expect(excelSerialToIso(61)).toBe('1900-03-01');
    expect(excelSerialToIso(45658)).toBe('2025-01-01');
    expect(excelSerialToIso(45658.75)).toBe('2025-01-01');
  });

  it('has no calendar date for serial 60, the non-existent 1900-02-29, nor for 0', () => {
    expect(excelSerialToIso(60)).toBeNull();
    expect(excelSerialToIso(0)).toBeNull();
  });

  it('rejects a workbook date cell holding serial 60, naming the row', async () => {
    const bytes = workbookBytes([
      {
        name: 'Staff',
        rows: [
          ['Staff No', 'Start Date'],
          ['QF-1', 61],
          ['QF-2', 60],
        ],
        dateCells: ['B2', 'B3'],
      },
    ]);
    const error = await parseUpload(bytes).catch((e: IntakeError) => e);
    expect(error).toBeInstanceOf(IntakeError);
    expect((error as IntakeError).details).toEqual({
      rows: [{ row: 3, column: 'Start Date', reason: expect.stringMatching(/29 Feb 1900/) }],
      count: 1,
    });
  });
});

describe('written dates', () => {
  it('reads ISO dates, with or without a time, and named months', () => {
    expect(parseDateText('2025-10-01')).toEqual({ kind: 'exact', iso: '2025-10-01' });
    expect(parseDateText('2025-10-01T00:00:00Z')).toEqual({ kind: 'exact', iso: '2025-10-01' });
    expect(parseDateText('3 Apr 2025')).toEqual({ kind: 'exact', iso: '2025-04-03' });
    expect(parseDateText('03-Apr-2025')).toEqual({ kind: 'exact', iso: '2025-04-03' });
    expect(parseDateText('April 3, 2025')).toEqual({ kind: 'exact', iso: '2025-04-03' });
    expect(parseDateText('2025-02-30')).toEqual({ kind: 'exact', iso: null });
    expect(parseDateText('Crew 4')).toBeNull();
  });

  it('keeps the order of 03/04/2025 open until the column decides', () => {
    const parsed = parseDateText('03/04/2025') as ParsedDateText;
    expect(resolveDateText(parsed, 'dmy')).toBe('2025-04-03');
    expect(resolveDateText(parsed, 'mdy')).toBe('2025-03-04');
  });

  it('decides day-first or month-first from values that only fit one', () => {
    const dayFirst = ['03/04/2025', '25/12/2024'].map((t) => parseDateText(t) as ParsedDateText);
    const monthFirst = ['03/04/2025', '12/25/2024'].map((t) => parseDateText(t) as ParsedDateText);
    expect(decideDateOrder(dayFirst)).toBe('dmy');
    expect(decideDateOrder(monthFirst)).toBe('mdy');
  });

  it('reports a column where every value fits both orders as ambiguous instead of guessing', async () => {
    const values = ['03/04/2025', '01/02/2024'].map((t) => parseDateText(t) as ParsedDateText);
    expect(decideDateOrder(values)).toBe('ambiguous');
    const parsed = await parseUpload(csvBytes('Staff No,Start Date\nQF-1,03/04/2025\nQF-2,01/02/2024\n'));
    expect(parsed.profile[1]).toMatchObject({ type: 'date', dateOrder: 'ambiguous' });
    expect(parsed.warnings.join(' ')).toMatch(/Start Date.*dateOrder/);
  });

  it('converts a day-first column to ISO dates', async () => {
    const parsed = await parseUpload(csvBytes('Staff No,Start Date\nQF-1,03/04/2025\nQF-2,25.12.2024\n'));
    expect(parsed.table.columns[1].values).toEqual(['2025-04-03', '2024-12-25']);
    expect(parsed.profile[1]).toMatchObject({ dateOrder: 'dmy', min: '2024-12-25', max: '2025-04-03' });
  });
});
