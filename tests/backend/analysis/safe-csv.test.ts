import { describe, expect, it } from 'vitest';
import { csvCell, toCsv } from '../../../backend/src/analysis/safe-csv';

describe('CSV exports', () => {
  // OWASP "CSV Injection": cells starting with = + - @ tab or carriage return are escaped.
  it.each([
    ['=HYPERLINK("http://x","click")', `"'=HYPERLINK(""http://x"",""click"")"`],
    ['+1+2', "'+1+2"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1:A2)', "'@SUM(A1:A2)"],
    ['\t=1', "'\t=1"],
    ['\r=1', `"'\r=1"`],
  ])('makes a cell that starts like a formula (%j) plain text', (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  it('leaves ordinary text, numbers and empty values alone', () => {
    expect(csvCell('Depot North')).toBe('Depot North');
    expect(csvCell(-0.25)).toBe('-0.25');
    expect(csvCell(12)).toBe('12');
    expect(csvCell(null)).toBe('');
    expect(csvCell('a, b')).toBe('"a, b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
  });

  it('writes a header and rows with CRLF line ends', () => {
    expect(toCsv(['who', 'what'], [['a@example.org', '=cmd']])).toBe("who,what\r\na@example.org,'=cmd\r\n");
  });
});
