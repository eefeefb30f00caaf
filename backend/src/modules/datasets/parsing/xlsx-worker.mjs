// Runs inside a throw-away worker thread: the only place where untrusted workbook bytes meet the
// xlsx package (its npm release has published advisories for crafted files). It sends back plain
// data only: sheet names, and the chosen sheet as columns of string | number | boolean | null.
import { parentPort, workerData } from 'node:worker_threads';
// The mini build reads XLSX only (no legacy formats, no codepage tables): less to load, less to attack.
import XLSX from 'xlsx/dist/xlsx.mini.min.js';

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

  const columns = Array.from({ length: width }, () => new Array(height).fill(null));
  const masks = Array.from({ length: width }, () => new Uint8Array(height));
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
            columns[c][r] = value;
            if (isDateFormat(cell.z)) masks[c][r] = 1;
          }
          break;
        case 's':
        case 'str':
          columns[c][r] = typeof value === 'string' ? value : String(value ?? '');
          break;
        case 'b':
          columns[c][r] = value === true;
          break;
        case 'd':
          columns[c][r] = value instanceof Date ? value.toISOString().slice(0, 10) : null;
          break;
        case 'e':
          errorCells += 1;
          break;
        default:
          break;
      }
    }
  }
  parentPort.postMessage(
    { ok: true, sheetName, sheetNames, columns, masks, height, errorCells },
    masks.map((mask) => mask.buffer),
  );
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
