/**
 * CSV export whose cells a spreadsheet cannot run as formulas.
 *
 * OWASP "CSV Injection" guidance: a cell that begins with `=`, `+`, `-`, `@`, a tab or a carriage
 * return may be read as a formula, so such cells are prefixed with a single quote, which makes the
 * spreadsheet treat them as text. Numbers are written as numbers (a negative number is a number,
 * not a formula), everything else as quoted text per RFC 4180.
 */
export type CsvValue = string | number | boolean | Date | null | undefined;

const FORMULA_START = new Set(['=', '+', '-', '@', '\t', '\r']);

export function neutraliseFormula(text: string): string {
  return text.length > 0 && FORMULA_START.has(text[0]!) ? `'${text}` : text;
}

export function csvCell(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  const text = neutraliseFormula(value instanceof Date ? value.toISOString() : value);
  return /[",\r\n]/.test(text) || text !== text.trim() ? `"${text.replaceAll('"', '""')}"` : text;
}

export function csvRow(values: readonly CsvValue[]): string {
  return values.map(csvCell).join(',');
}

/** A whole CSV document: header row, then one row per record, CRLF line ends (RFC 4180). */
export function toCsv(header: readonly string[], rows: readonly (readonly CsvValue[])[]): string {
  return [csvRow(header), ...rows.map(csvRow)].join('\r\n') + '\r\n';
}
