import { IntakeError } from './intake-error';

export type Cell = string | number | boolean | null;

export type IntakeLimits = {
  maxRows: number;
  maxColumns: number;
  maxHeaderLength: number;
  /** total uncompressed size of all parts of an XLSX, in bytes */
  maxUncompressedBytes: number;
  /** uncompressed ÷ compressed size of any one part of an XLSX */
  maxCompressionRatio: number;
  /** wall-clock limit for reading one workbook, in milliseconds */
  workbookTimeoutMs: number;
  /** heap limit of the throw-away workbook reader, in megabytes */
  workbookHeapMb: number;
  /** a sheet with more XML than this is read in parts of about this size, in bytes */
  workbookPartBytes: number;
};

export const DEFAULT_LIMITS: IntakeLimits = {
  maxRows: 500_000,
  maxColumns: 300,
  maxHeaderLength: 100,
  maxUncompressedBytes: 1024 * 1024 * 1024,
  maxCompressionRatio: 200,
  workbookTimeoutMs: 120_000,
  workbookHeapMb: 3072,
  workbookPartBytes: 8 * 1024 * 1024,
};

/** A parsed upload: one header and the data as columns, with the spreadsheet row number of each row. */
export type RawTable = {
  header: string[];
  columns: Cell[][];
  /** 1-based row numbers as the analyst sees them in a spreadsheet program */
  rowNumbers: number[];
  /** XLSX only: per column, 1 where a number cell carries a date format (an Excel date serial) */
  dateMasks?: (Uint8Array | null)[];
  sheetName?: string;
  sheetNames?: string[];
  /** CSV only: numbers are written with a decimal comma (semicolon-separated exports) */
  decimalComma?: boolean;
  warnings: string[];
};

/** Column letter as spreadsheet programs show it: 0 → A, 26 → AA. */
export function columnLetter(index: number): string {
  let n = index + 1;
  let letters = '';
  while (n > 0) {
    const rest = (n - 1) % 26;
    letters = String.fromCharCode(65 + rest) + letters;
    n = Math.floor((n - 1) / 26);
  }
  return letters;
}

function describeColumn(index: number): string {
  return `column ${columnLetter(index)} (${index + 1})`;
}

export function normaliseCell(value: Cell | undefined): Cell {
  if (value === undefined || value === null) return null;
  if (typeof value === 'string') {
    const trimmed = value.trim();
    return trimmed === '' ? null : trimmed;
  }
  if (typeof value === 'number' && !Number.isFinite(value)) return null;
  return value;
}

/**
 * Turns a grid (column-major, every row of the sheet) into a table: the first non-empty row is the
 * header, empty rows are skipped, and the header is checked (blank, duplicated, over-long names).
 */
export function tableFromGrid(
  grid: Cell[][],
  height: number,
  limits: IntakeLimits,
  extra: Pick<RawTable, 'dateMasks' | 'sheetName' | 'sheetNames' | 'decimalComma' | 'warnings'> & {
    /** every cell is already what normaliseCell would make of it */
    normalised?: boolean;
  } = {
    warnings: [],
  },
): RawTable {
  // One pass, column by column: normalise every cell in place and note which rows have data and
  // where each column's last value is.
  const rowHasData = new Uint8Array(height);
  const lastValue = new Int32Array(grid.length).fill(-1);
  const normalised = extra.normalised === true;
  grid.forEach((column, c) => {
    for (let r = 0; r < height; r += 1) {
      const value = normalised ? column[r] : normaliseCell(column[r]);
      if (!normalised) column[r] = value;
      if (value !== null) {
        rowHasData[r] = 1;
        lastValue[c] = r;
      }
    }
  });
  const headerRow = rowHasData.indexOf(1);
  if (headerRow < 0) {
    throw new IntakeError(
      'file_empty',
      422,
      'The file has no data in it. Export the staff list again and upload it.',
    );
  }

  const dataRows: number[] = [];
  for (let r = headerRow + 1; r < height; r += 1) {
    if (rowHasData[r]) dataRows.push(r);
  }

  // Columns with neither a header nor any value (formatting left in a workbook) are dropped silently.
  const kept: number[] = [];
  grid.forEach((column, c) => {
    if (column[headerRow] !== null || lastValue[c] > headerRow) kept.push(c);
  });

  if (kept.length > limits.maxColumns) {
    throw new IntakeError(
      'too_many_columns',
      413,
      `The file has ${kept.length} columns; the limit is ${limits.maxColumns}. Remove columns you do not need and upload again.`,
      { columns: kept.length, limit: limits.maxColumns },
    );
  }
  if (dataRows.length > limits.maxRows) {
    throw new IntakeError(
      'too_many_rows',
      413,
      `The file has ${dataRows.length} rows; the limit is ${limits.maxRows}. Split the export and upload the parts as separate datasets.`,
      { rows: dataRows.length, limit: limits.maxRows },
    );
  }

  const header = kept.map((c) => {
    const value = normaliseCell(grid[c][headerRow]);
    return value === null ? '' : String(value).replace(/\s+/g, ' ');
  });
  const problems: { column: string; position: number; name: string; reason: string }[] = [];
  const seen = new Map<string, number>();
  header.forEach((name, i) => {
    const c = kept[i];
    const where = { column: columnLetter(c), position: c + 1, name };
    if (name === '') {
      problems.push({ ...where, reason: 'blank header' });
      return;
    }
    // Invisible controls and direction overrides would make a column show under a false name.
    if (/[\p{Cc}\u200E\u200F\u202A-\u202E\u2066-\u2069]/u.test(name)) {
      problems.push({ ...where, reason: 'invisible control or text-direction characters' });
    }
    if (name.length > limits.maxHeaderLength) {
      problems.push({ ...where, reason: `header longer than ${limits.maxHeaderLength} characters` });
    }
    const key = name.toLowerCase();
    const first = seen.get(key);
    if (first !== undefined) {
      problems.push({ ...where, reason: `same header as ${describeColumn(kept[first])}` });
    } else {
      seen.set(key, i);
    }
  });
  if (problems.length > 0) {
    const list = problems.map((p) => `${describeColumn(p.position - 1)}: ${p.reason}`).join('; ');
    throw new IntakeError(
      'header_invalid',
      422,
      `The header row (row ${headerRow + 1}) has problems: ${list}. Give every column a short, unique name and upload again.`,
      { headerRow: headerRow + 1, columns: problems },
    );
  }

  if (dataRows.length === 0) {
    throw new IntakeError(
      'no_rows',
      422,
      `The file has a header (row ${headerRow + 1}) but no rows under it. Export the staff list with its rows and upload again.`,
    );
  }

  const contiguous = dataRows.length === height - headerRow - 1;
  const columns = kept.map((c) => {
    const source = grid[c];
    return contiguous ? source.slice(headerRow + 1, height) : dataRows.map((r) => source[r]);
  });
  const dateMasks = extra.dateMasks
    ? kept.map((c) => {
        const mask = extra.dateMasks?.[c];
        if (!mask) return null;
        return Uint8Array.from(dataRows, (r) => mask[r] ?? 0);
      })
    : undefined;

  return {
    header,
    columns,
    rowNumbers: dataRows.map((r) => r + 1),
    dateMasks,
    sheetName: extra.sheetName,
    sheetNames: extra.sheetNames,
    decimalComma: extra.decimalComma,
    warnings: extra.warnings,
  };
}
