import type { Cell, RawTable } from './build-table';
import {
  type ColumnDateOrder,
  decideDateOrder,
  excelSerialToIso,
  type ParsedDateText,
  parseDateText,
  resolveDateText,
} from './dates';
import { IntakeError, ROW_PROBLEM_LIMIT, type RowProblem } from './intake-error';

export type ColumnType = 'number' | 'category' | 'date' | 'yes-no' | 'identifier' | 'free-text';

export type TypedColumn =
  | { name: string; type: 'number'; values: (number | null)[] }
  /** ISO dates; when `dateOrder` is 'ambiguous', numeric forms keep their text until the mapping says which order */
  | { name: string; type: 'date'; values: (string | null)[]; dateOrder: ColumnDateOrder }
  | { name: string; type: 'category' | 'yes-no' | 'identifier' | 'free-text'; values: (string | null)[] };

export type TypedTable = { columns: TypedColumn[]; rowNumbers: number[] };

const MISSING = new Set(['na', 'n/a', '#n/a', 'null', 'nan']);
const MISSING_NUMBER = new Set([...MISSING, '-', '?', 'unknown', 'not known']);
const YES_NO = new Set(['yes', 'no', 'y', 'n', 'true', 'false']);
const ID_HEADER =
  /\b(id|staff ?(no|number|#)|employee ?(no|number|#|code)|emp ?(no|#|id)|payroll ?(no|number|id)?|personnel ?(no|number)|person ?(no|number)|worker ?(no|number))\b/i;
const CODE_VALUE = /^[A-Za-z]{0,5}[-_/]?\d{2,}$/;

export function isMissing(value: Cell): boolean {
  return value === null || (typeof value === 'string' && MISSING.has(value.toLowerCase()));
}

/** Numbers as exports write them: 1234.5, 1,234.5, or 1234,5 where values are separated by semicolons. */
export function parseNumber(text: string, decimalComma = false): number | null {
  const value = text.trim();
  // Leading zeros mark codes (phone numbers, payroll numbers), not quantities.
  if (/^[-+]?0\d/.test(value)) return null;
  if (decimalComma && /^[-+]?\d+(,\d+)?$/.test(value)) return Number(value.replace(',', '.'));
  if (/^[-+]?(\d+|\d{1,3}(,\d{3})+)?(\.\d+)?([eE][-+]?\d+)?$/.test(value) && /\d/.test(value)) {
    return Number(value.replace(/,/g, ''));
  }
  return null;
}

function textOf(value: Cell): string {
  if (value === null) return '';
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  return String(value);
}

function preview(value: Cell): string {
  const text = textOf(value);
  return text.length > 40 ? `${text.slice(0, 40)}…` : text;
}

type Problems = RowProblem[];

function typeColumn(
  name: string,
  cells: Cell[],
  mask: Uint8Array | null | undefined,
  rowNumbers: number[],
  decimalComma: boolean,
  problems: Problems,
): TypedColumn {
  const present: number[] = [];
  for (let i = 0; i < cells.length; i += 1) if (!isMissing(cells[i])) present.push(i);
  const n = present.length;
  const toText = () => cells.map((value) => (isMissing(value) ? null : textOf(value)));
  if (n === 0) return { name, type: 'category', values: cells.map(() => null) };

  // Dates: Excel serials with a date format, or text in a date form.
  const parsed: (ParsedDateText | null)[] = new Array(cells.length).fill(null);
  let dateLike = 0;
  for (const i of present) {
    const value = cells[i];
    if (typeof value === 'number' && mask?.[i]) {
      dateLike += 1;
    } else if (typeof value === 'string') {
      parsed[i] = parseDateText(value);
      if (parsed[i]) dateLike += 1;
    }
  }
  if (dateLike >= 0.8 * n) {
    const texts = parsed.filter((p): p is ParsedDateText => p !== null);
    const order = decideDateOrder(texts);
    const values: (string | null)[] = cells.map(() => null);
    for (const i of present) {
      const value = cells[i];
      const p = parsed[i];
      let iso: string | null = null;
      if (typeof value === 'number' && mask?.[i]) {
        iso = excelSerialToIso(value);
        if (iso === null) {
          problems.push({
            row: rowNumbers[i],
            column: name,
            reason:
              value === 60
                ? 'Excel serial 60 is 29 Feb 1900, a day that never existed'
                : `${value} is not a date`,
          });
        }
      } else if (p?.kind === 'exact') {
        iso = p.iso;
        if (iso === null)
          problems.push({
            row: rowNumbers[i],
            column: name,
            reason: `"${preview(value)}" is not a real date`,
          });
      } else if (p?.kind === 'numeric') {
        if (order === 'ambiguous') {
          iso = String(value);
        } else {
          iso = resolveDateText(p, order === 'mdy' ? 'mdy' : 'dmy');
          if (iso === null) {
            const form = order === 'mdy' ? 'month-first' : 'day-first';
            problems.push({
              row: rowNumbers[i],
              column: name,
              reason: `"${preview(value)}" is not a real date in this column's ${form} form`,
            });
          }
        }
      } else {
        problems.push({ row: rowNumbers[i], column: name, reason: `"${preview(value)}" is not a date` });
      }
      values[i] = iso;
    }
    return { name, type: 'date', values, dateOrder: order };
  }

  const texts = toText();
  const distinct = new Set<string>();
  for (const i of present) distinct.add(texts[i]!.toLowerCase());

  if ([...distinct].every((value) => YES_NO.has(value))) return { name, type: 'yes-no', values: texts };

  const looksLikeId = ID_HEADER.test(name);
  if (!looksLikeId) {
    const numbers: (number | null)[] = cells.map(() => null);
    let numeric = 0;
    const stray: number[] = [];
    for (const i of present) {
      const value = cells[i];
      const number =
        typeof value === 'number'
          ? value
          : typeof value === 'string'
            ? parseNumber(value, decimalComma)
            : null;
      if (number !== null) {
        numbers[i] = number;
        numeric += 1;
      } else if (!(typeof value === 'string' && MISSING_NUMBER.has(value.toLowerCase()))) {
        stray.push(i);
      }
    }
    if (numeric > 0 && numeric >= 0.95 * n) {
      for (const i of stray) {
        problems.push({ row: rowNumbers[i], column: name, reason: `"${preview(cells[i])}" is not a number` });
      }
      return { name, type: 'number', values: numbers };
    }
  }

  const distinctShare = distinct.size / n;
  // An ID column stays an identifier even with repeats, so that the mapping can name the duplicated rows.
  if (looksLikeId) return { name, type: 'identifier', values: texts };
  let codeLike = 0;
  let totalLength = 0;
  let words = 0;
  for (const i of present) {
    const text = texts[i]!;
    if (CODE_VALUE.test(text)) codeLike += 1;
    totalLength += text.length;
    words += text.split(/\s+/).length;
  }
  if (n >= 20 && distinctShare >= 0.95) {
    if (codeLike >= 0.9 * n || (totalLength / n <= 40 && words / n <= 4)) {
      return { name, type: 'identifier', values: texts };
    }
    return { name, type: 'free-text', values: texts };
  }
  if (distinct.size <= 50 || distinctShare <= 0.2) return { name, type: 'category', values: texts };
  return { name, type: 'free-text', values: texts };
}

/**
 * Gives every column a type and typed values. Values that do not fit their column's type (a word
 * in a date column, 31/02/2025) are row problems: the whole upload is rejected and the first 50
 * are listed with the total count.
 */
export function typeColumns(table: RawTable): TypedTable {
  const problems: Problems = [];
  const columns = table.header.map((name, c) =>
    typeColumn(
      name,
      table.columns[c],
      table.dateMasks?.[c],
      table.rowNumbers,
      table.decimalComma ?? false,
      problems,
    ),
  );
  if (problems.length > 0) {
    problems.sort((a, b) => a.row - b.row);
    const count = problems.length;
    throw new IntakeError(
      'rows_invalid',
      422,
      `${count} value(s) do not fit their column (see the rows listed). Fix them in the export and upload again; nothing was stored.`,
      { rows: problems.slice(0, ROW_PROBLEM_LIMIT), count },
    );
  }
  return { columns, rowNumbers: table.rowNumbers };
}
