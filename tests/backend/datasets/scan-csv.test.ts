import { parse } from 'csv-parse/sync';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { scanCsv, UnclosedQuoteError } from '../../../backend/src/modules/datasets/parsing/scan-csv';

function writeCsv(records: string[][], delimiter: string, newline: string): string {
  const field = (value: string) =>
    value.includes('"') || value.includes(delimiter) || /[\r\n]/.test(value) || value === ''
      ? `"${value.replace(/"/g, '""')}"`
      : value;
  return records.map((record) => record.map(field).join(delimiter)).join(newline) + newline;
}

describe('reading CSV text', () => {
  it('reads quoted values with delimiters, doubled quotes and line breaks', () => {
    const text = 'a,b,c\r\n"x, y","say ""hi""","two\nlines"\n1,,3\n';
    expect(scanCsv(text, ',')).toEqual([
      ['a', 'b', 'c'],
      ['x, y', 'say "hi"', 'two\nlines'],
      ['1', '', '3'],
    ]);
  });

  it('keeps blank lines as records, so that row numbers match a spreadsheet program', () => {
    expect(scanCsv('a;b\n\n1;2', ';')).toEqual([['a', 'b'], [''], ['1', '2']]);
  });

  it('keeps a stray quote inside an unquoted value as text', () => {
    expect(scanCsv('height\n5\'10"\n', ',')).toEqual([['height'], ['5\'10"']]);
  });

  it('names the record whose quote is never closed', () => {
    try {
      scanCsv('a,b\n1,2\n3,"4\n5,6\n', ',');
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(UnclosedQuoteError);
      expect((error as UnclosedQuoteError).record).toBe(3);
    }
  });

  // The npm package csv-parse, a general-purpose CSV parser, serves as the reference reader.
  it('reads what a CSV writer wrote exactly as csv-parse does, for any records', () => {
    const value = fc.string({
      unit: fc.constantFrom('a', 'Z', '1', ' ', ',', ';', '"', '\n', '\r\n', 'é', '\t'),
    });
    fc.assert(
      fc.property(
        fc.array(fc.array(value, { minLength: 2, maxLength: 2 }), { minLength: 1, maxLength: 20 }),
        fc.constantFrom(',', ';', '\t'),
        fc.constantFrom('\n', '\r\n'),
        (records, delimiter, newline) => {
          const text = writeCsv(records, delimiter, newline);
          const ours = scanCsv(text, delimiter);
          expect(ours).toEqual(records);
          expect(ours).toEqual(parse(text, { delimiter, relax_column_count: true }));
        },
      ),
      { numRuns: 300 },
    );
  });
});
