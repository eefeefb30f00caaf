// Runs inside a throw-away worker thread: the only place where untrusted workbook bytes meet the
// xlsx package (its npm release has published advisories for crafted files). It sends back plain
// data only: sheet names, and the chosen sheet as typed-array columns (see the end of run()).
import { parentPort, workerData } from 'node:worker_threads';
// The mini build reads XLSX only (no legacy formats, no codepage tables): less to load, less to attack.
import XLSX from 'xlsx/dist/xlsx.mini.min.js';

// Cell kinds in the typed-array columns; the reader (parse-xlsx.ts) has the same table.
const KIND = { empty: 0, number: 1, dateSerial: 2, text: 3, true: 4, false: 5 };

function fail(code, status, message, details) {
  parentPort.postMessage({ ok: false, code, status, message, details });
}

function hasData(sheet) {
  return (
    Array.isArray(sheet) &&
    sheet.some(
      (row) =>
        Array.isArray(row) &&
        row.some((cell) => cell && cell.v !== undefined && cell.v !== null && cell.v !== ''),
    )
  );
}

function run() {
  const { bytes, sheet: wantedSheet, maxRows, maxColumns } = workerData;
  const rowLimit = maxRows + 100; // header and blank rows above it
  let workbook;
  try {
    workbook = XLSX.read(bytes, {
      type: 'array',
      dense: true,
      cellNF: true,
      cellText: false,
      cellHTML: false,
      cellFormula: false,
      cellStyles: false,
      bookVBA: false,
      sheetRows: rowLimit,
    });
  } catch (error) {
    const text = String(error?.message ?? error);
    if (/password|encrypt/i.test(text)) {
      fail(
        'workbook_encrypted',
        422,
        'The workbook is password-protected, so it cannot be read. Open it, remove the password, save it as .xlsx and upload it again.',
      );
      return;
    }
    fail(
      'workbook_unreadable',
      422,
      'The workbook could not be read. Open it in your spreadsheet program, save it as .xlsx again and upload it.',
      { reason: text.slice(0, 200) },
    );
    return;
  }

  const sheetNames = workbook.SheetNames.slice();
  let sheetName;
  if (wantedSheet) {
    if (!sheetNames.includes(wantedSheet)) {
      fail(
        'sheet_not_found',
        422,
        `The workbook has no sheet named "${wantedSheet}". Choose one of: ${sheetNames.join(', ')}.`,
        { sheetNames },
      );
      return;
    }
    sheetName = wantedSheet;
  } else {
    sheetName = sheetNames.find((name) => hasData(workbook.Sheets[name]));
    if (!sheetName) {
      fail(
        'file_empty',
        422,
        'The workbook has no data in any sheet. Export the staff list again and upload it.',
        { sheetNames },
      );
      return;
    }
  }

  const sheet = workbook.Sheets[sheetName];
  const fullRef = sheet['!fullref'];
  if (fullRef) {
    const rows = XLSX.utils.decode_range(fullRef).e.r + 1;
    if (rows > rowLimit) {
      fail(
        'too_many_rows',
        413,
        `The sheet "${sheetName}" has about ${rows} rows; the limit is ${maxRows}. Split the export and upload the parts as separate datasets.`,
        { rows, limit: maxRows },
      );
      return;
    }
  }
  const merges = sheet['!merges'] || [];
  if (merges.length > 0) {
    const ranges = merges.slice(0, 20).map((range) => XLSX.utils.encode_range(range));
    fail(
      'merged_cells',
      422,
      `The sheet "${sheetName}" has merged cells (${ranges.join(', ')}${merges.length > 20 ? ', …' : ''}). Unmerge them so that every row has its own values, and upload again.`,
      { ranges, count: merges.length },
    );
    return;
  }

  const rows = Array.isArray(sheet) ? sheet : [];
  const height = rows.length;
  let width = 0;
  for (const row of rows) if (Array.isArray(row) && row.length > width) width = row.length;
  if (width > maxColumns + 50) {
    fail(
      'too_many_columns',
      413,
      `The sheet "${sheetName}" has ${width} columns; the limit is ${maxColumns}. Remove columns you do not need and upload again.`,
      { columns: width, limit: maxColumns },
    );
    return;
  }

  const dateFormats = new Map();
  const isDateFormat = (format) => {
    if (!format || format === 'General') return false;
    let known = dateFormats.get(format);
    if (known === undefined) {
      known = XLSX.SSF.is_date(format);
      dateFormats.set(format, known);
    }
    return known;
  };

  // Each column crosses back as typed arrays (moved, not copied) plus its distinct texts: far
  // cheaper for both threads than a structured clone of millions of cells.
  const kinds = Array.from({ length: width }, () => new Uint8Array(height));
  const values = Array.from({ length: width }, () => new Float64Array(height));
  const texts = Array.from({ length: width }, () => []);
  const textIds = Array.from({ length: width }, () => new Map());
  const putText = (c, r, text) => {
    let id = textIds[c].get(text);
    if (id === undefined) {
      id = texts[c].length;
      texts[c].push(text);
      textIds[c].set(text, id);
    }
    kinds[c][r] = KIND.text;
    values[c][r] = id;
  };
  let errorCells = 0;
  for (let r = 0; r < height; r += 1) {
    const row = rows[r];
    if (!Array.isArray(row)) continue;
    for (let c = 0; c < row.length; c += 1) {
      const cell = row[c];
      if (!cell) continue;
      const value = cell.v;
      switch (cell.t) {
        case 'n':
          if (typeof value === 'number' && Number.isFinite(value)) {
            kinds[c][r] = isDateFormat(cell.z) ? KIND.dateSerial : KIND.number;
            values[c][r] = value;
          }
          break;
        case 's':
        case 'str':
          putText(c, r, typeof value === 'string' ? value : String(value ?? ''));
          break;
        case 'b':
          kinds[c][r] = value === true ? KIND.true : KIND.false;
          break;
        case 'd':
          if (value instanceof Date) putText(c, r, value.toISOString().slice(0, 10));
          break;
        case 'e':
          errorCells += 1;
          break;
        default:
          break;
      }
    }
    rows[r] = undefined; // lets the cells go while the columns fill
  }
  parentPort.postMessage({ ok: true, sheetName, sheetNames, kinds, values, texts, height, errorCells }, [
    ...kinds.map((column) => column.buffer),
    ...values.map((column) => column.buffer),
  ]);
}

try {
  run();
} catch (error) {
  fail(
    'workbook_unreadable',
    422,
    'The workbook could not be read. Open it in your spreadsheet program, save it as .xlsx again and upload it.',
    { reason: String(error?.message ?? error).slice(0, 200) },
  );
}
