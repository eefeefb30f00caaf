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
  return (
    value === null || (typeof value === 'string' && value.length <= 4 && MISSING.has(value.toLowerCase()))
  );
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

/**
 * A column as its distinct values and, per row, the index of its value (-1 = missing). Staff
 * exports repeat values a lot, so every decision and conversion runs once per distinct value.
 */
type Dictionary = {
  keys: Cell[];
  /** 1 where the key is a number cell with a date format (an Excel serial) */
  serial: Uint8Array;
  counts: number[];
  ids: Int32Array;
  present: number;
};

function dictionary(cells: Cell[], mask: Uint8Array | null | undefined): Dictionary {
  const plain = new Map<Cell, number>();
  const serials = new Map<number, number>();
  const keys: Cell[] = [];
  const serialFlags: number[] = [];
  const counts: number[] = [];
  const ids = new Int32Array(cells.length);
  let present = 0;
  for (let i = 0; i < cells.length; i += 1) {
    const value = cells[i];
    if (value === null) {
      ids[i] = -1;
      continue;
    }
    const isSerial = typeof value === 'number' && mask?.[i] === 1;
    const lookup = isSerial ? serials : plain;
    let id = lookup.get(value as number);
    if (id === undefined) {
      // Decided once per distinct value; missing markers (NA, n/a…) are remembered as -1.
      if (isMissing(value)) {
        id = -1;
      } else {
        id = keys.length;
        keys.push(value);
        serialFlags.push(isSerial ? 1 : 0);
        counts.push(0);
      }
      lookup.set(value as number, id);
    }
    ids[i] = id;
    if (id >= 0) {
      counts[id] += 1;
      present += 1;
    }
  }
  return { keys, serial: Uint8Array.from(serialFlags), counts, ids, present };
}

function expand<T>(dict: Dictionary, converted: T[]): (T | null)[] {
  const out = new Array<T | null>(dict.ids.length);
  for (let i = 0; i < dict.ids.length; i += 1) {
    const id = dict.ids[i];
    out[i] = id < 0 ? null : converted[id];
  }
  return out;
}

/** Row problems for every row whose value is one of the `bad` keys. */
function problemRows(
  dict: Dictionary,
  bad: Map<number, string>,
  name: string,
  rowNumbers: number[],
  problems: Problems,
): void {
  if (bad.size === 0) return;
  for (let i = 0; i < dict.ids.length; i += 1) {
    const reason = bad.get(dict.ids[i]);
    if (reason !== undefined) problems.push({ row: rowNumbers[i], column: name, reason });
  }
}

function typeColumn(
  name: string,
  cells: Cell[],
  mask: Uint8Array | null | undefined,
  rowNumbers: number[],
  decimalComma: boolean,
  problems: Problems,
): TypedColumn {
  const dict = dictionary(cells, mask);
  const { keys, counts, present: n } = dict;
  if (n === 0) return { name, type: 'category', values: cells.map(() => null) };

  // Dates: Excel serials with a date format, or text in a date form.
  const parsedDates = keys.map((key, id) =>
    dict.serial[id] ? null : typeof key === 'string' ? parseDateText(key) : null,
  );
  let dateLike = 0;
  keys.forEach((_, id) => {
    if (dict.serial[id] || parsedDates[id]) dateLike += counts[id];
  });
  if (dateLike >= 0.8 * n) {
    const order = decideDateOrder(parsedDates.filter((p): p is ParsedDateText => p !== null));
    const bad = new Map<number, string>();
    const iso = keys.map((key, id): string | null => {
      const parsed = parsedDates[id];
      if (dict.serial[id]) {
        const date = excelSerialToIso(key as number);
        if (date === null) {
          bad.set(
            id,
            key === 60 ? 'Excel serial 60 is 29 Feb 1900, a day that never existed' : `${key} is not a date`,
          );
        }
        return date;
      }
      if (parsed?.kind === 'exact') {
        if (parsed.iso === null) bad.set(id, `"${preview(key)}" is not a real date`);
        return parsed.iso;
      }
      if (parsed?.kind === 'numeric') {
        if (order === 'ambiguous') return String(key);
        const date = resolveDateText(parsed, order === 'mdy' ? 'mdy' : 'dmy');
        if (date === null) {
          const form = order === 'mdy' ? 'month-first' : 'day-first';
          bad.set(id, `"${preview(key)}" is not a real date in this column's ${form} form`);
        }
        return date;
      }
      bad.set(id, `"${preview(key)}" is not a date`);
      return null;
    });
    problemRows(dict, bad, name, rowNumbers, problems);
    return { name, type: 'date', values: expand(dict, iso), dateOrder: order };
  }

  const texts = keys.map(textOf);
  const lower = texts.map((text) => text.toLowerCase());
  if (lower.every((value) => YES_NO.has(value))) return { name, type: 'yes-no', values: expand(dict, texts) };

  const looksLikeId = ID_HEADER.test(name);
  if (!looksLikeId) {
    const numbers = keys.map((key) =>
      typeof key === 'number' ? key : typeof key === 'string' ? parseNumber(key, decimalComma) : null,
    );
    let numeric = 0;
    let stray = 0;
    const bad = new Map<number, string>();
    keys.forEach((key, id) => {
      if (numbers[id] !== null) numeric += counts[id];
      else if (!MISSING_NUMBER.has(lower[id])) {
        stray += counts[id];
        bad.set(id, `"${preview(key)}" is not a number`);
      }
    });
    if (numeric >= 0.5 * n && stray <= 0.05 * n) {
      problemRows(dict, bad, name, rowNumbers, problems);
      return { name, type: 'number', values: expand(dict, numbers) };
    }
  }

  const distinct = new Set(lower).size;
  const distinctShare = distinct / n;
  const values = expand(dict, texts);
  // An ID column stays an identifier even with repeats, so that the mapping can name the duplicated rows.
  if (looksLikeId) return { name, type: 'identifier', values };
  let codeLike = 0;
  let totalLength = 0;
  let words = 0;
  texts.forEach((text, id) => {
    if (CODE_VALUE.test(text)) codeLike += counts[id];
    totalLength += text.length * counts[id];
    words += text.split(/\s+/).length * counts[id];
  });
  if (n >= 20 && distinctShare >= 0.95) {
    if (codeLike >= 0.9 * n || (totalLength / n <= 40 && words / n <= 4)) {
      return { name, type: 'identifier', values };
    }
    return { name, type: 'free-text', values };
  }
  if (distinct <= 50 || distinctShare <= 0.2) return { name, type: 'category', values };
  return { name, type: 'free-text', values };
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
