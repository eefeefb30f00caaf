/**
 * Dates in staff exports: Excel 1900-system serials and the common written forms.
 * Everything is turned into ISO calendar dates (YYYY-MM-DD) without time zones.
 */

export type DateOrder = 'dmy' | 'mdy';

const MS_PER_DAY = 86_400_000;
// 1899-12-30: the day before serial 1 once the fictitious 1900-02-29 (serial 60) is counted.
const SERIAL_EPOCH_AFTER_LEAP_BUG = Date.UTC(1899, 11, 30);
const SERIAL_EPOCH_BEFORE_LEAP_BUG = Date.UTC(1899, 11, 31);
const MAX_SERIAL = 2_958_465; // 9999-12-31

/**
 * Excel 1900 date system (ECMA-376 Part 1; from memory): serial 1 is 1900-01-01, serial 60 is the
 * non-existent 1900-02-29 kept for compatibility with an old spreadsheet bug, 61 is 1900-03-01.
 * The time of day (the fraction) is dropped. Returns null for serial 60 and out-of-range serials.
 */
export function excelSerialToIso(serial: number): string | null {
  if (!Number.isFinite(serial)) return null;
  const day = Math.floor(serial);
  if (day < 1 || day > MAX_SERIAL || day === 60) return null;
  const epoch = day < 60 ? SERIAL_EPOCH_BEFORE_LEAP_BUG : SERIAL_EPOCH_AFTER_LEAP_BUG;
  return new Date(epoch + day * MS_PER_DAY).toISOString().slice(0, 10);
}

export function isValidYmd(year: number, month: number, day: number): boolean {
  if (month < 1 || month > 12 || day < 1 || year < 1000 || year > 9999) return false;
  const date = new Date(Date.UTC(year, month - 1, day));
  return date.getUTCMonth() === month - 1 && date.getUTCDate() === day;
}

function ymd(year: number, month: number, day: number): string | null {
  if (!isValidYmd(year, month, day)) return null;
  return `${year}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

const MONTHS: Record<string, number> = {
  jan: 1,
  feb: 2,
  mar: 3,
  apr: 4,
  may: 5,
  jun: 6,
  jul: 7,
  aug: 8,
  sep: 9,
  sept: 9,
  oct: 10,
  nov: 11,
  dec: 12,
  january: 1,
  february: 2,
  march: 3,
  april: 4,
  june: 6,
  july: 7,
  august: 8,
  september: 9,
  october: 10,
  november: 11,
  december: 12,
};

const TIME = String.raw`(?:[T ]\d{1,2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?)?`;
const ISO_RE = new RegExp(String.raw`^(\d{4})[-/](\d{1,2})[-/](\d{1,2})${TIME}$`);
const NUMERIC_RE = new RegExp(String.raw`^(\d{1,2})([/.-])(\d{1,2})\2(\d{4})${TIME}$`);
const DAY_NAMED_RE = /^(\d{1,2})(?:st|nd|rd|th)?[ -]([A-Za-z]{3,9})\.?,?[ -](\d{4})$/;
const NAMED_DAY_RE = /^([A-Za-z]{3,9})\.? (\d{1,2})(?:st|nd|rd|th)?,? (\d{4})$/;

/** A written date: either already a calendar date, or a numeric a/b/yyyy form whose order is open. */
export type ParsedDateText =
  | { kind: 'exact'; iso: string | null }
  | { kind: 'numeric'; first: number; second: number; year: number };

/** Returns null when the text does not have the shape of a date at all. */
export function parseDateText(text: string): ParsedDateText | null {
  const value = text.trim();
  let m = ISO_RE.exec(value);
  if (m) return { kind: 'exact', iso: ymd(Number(m[1]), Number(m[2]), Number(m[3])) };
  m = NUMERIC_RE.exec(value);
  if (m) return { kind: 'numeric', first: Number(m[1]), second: Number(m[3]), year: Number(m[4]) };
  m = DAY_NAMED_RE.exec(value);
  if (m && MONTHS[m[2].toLowerCase()]) {
    return { kind: 'exact', iso: ymd(Number(m[3]), MONTHS[m[2].toLowerCase()], Number(m[1])) };
  }
  m = NAMED_DAY_RE.exec(value);
  if (m && MONTHS[m[1].toLowerCase()]) {
    return { kind: 'exact', iso: ymd(Number(m[3]), MONTHS[m[1].toLowerCase()], Number(m[2])) };
  }
  return null;
}

/** Calendar date of a parsed text under a day/month order (null when not a real date). */
export function resolveDateText(parsed: ParsedDateText, order: DateOrder): string | null {
  if (parsed.kind === 'exact') return parsed.iso;
  return order === 'dmy'
    ? ymd(parsed.year, parsed.second, parsed.first)
    : ymd(parsed.year, parsed.first, parsed.second);
}

export type ColumnDateOrder = DateOrder | 'ambiguous' | 'not-needed';

/**
 * Decides the day/month order of a column from all its numeric forms: a value like 25/03/2025 only
 * fits day-first. If every value fits both orders (and some differ when swapped), the column is
 * ambiguous and the analyst must say which; we never guess.
 */
export function decideDateOrder(values: ParsedDateText[]): ColumnDateOrder {
  let numeric = 0;
  let fitsDmy = 0;
  let fitsMdy = 0;
  let swapMatters = false;
  for (const value of values) {
    if (value.kind !== 'numeric') continue;
    numeric += 1;
    if (resolveDateText(value, 'dmy')) fitsDmy += 1;
    if (resolveDateText(value, 'mdy')) fitsMdy += 1;
    if (value.first !== value.second) swapMatters = true;
  }
  if (numeric === 0 || !swapMatters) return 'not-needed';
  if (fitsDmy === numeric && fitsMdy === numeric) return 'ambiguous';
  return fitsDmy >= fitsMdy ? 'dmy' : 'mdy';
}

/** Whole months between two ISO dates (fractional, average month length of the Gregorian year). */
export function monthsBetween(fromIso: string, toIso: string): number {
  const days = (Date.parse(toIso) - Date.parse(fromIso)) / MS_PER_DAY;
  return days / (365.2425 / 12);
}
