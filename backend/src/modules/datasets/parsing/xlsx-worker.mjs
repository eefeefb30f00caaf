// Runs inside a throw-away worker thread: the only place where untrusted workbook bytes meet the
// xlsx package (its npm release has published advisories for crafted files). It sends back plain
// data only: sheet names, and the chosen sheet as typed-array columns (see the end of run()).
//
// A large sheet is read in parts: the zip is unpacked (fflate), the sheet's rows are cut into
// parts of about `partBytes` of XML at row boundaries, and each part goes to the xlsx package as a
// workbook of its own (the original's styles, shared strings and so on, with only that part of the
// sheet). Each part's cells go into the columns and are let go before the next part is read, so
// the reader holds one part's cells rather than the whole sheet's (about 780 MB for 100,000 rows
// × 30 columns). Anything the cutter does not recognise falls back to reading the whole workbook.
import { Buffer } from 'node:buffer';
import os from 'node:os';
import { parentPort, workerData } from 'node:worker_threads';
import { unzipSync, zipSync } from 'fflate';
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

const READ_OPTIONS = {
  type: 'array',
  dense: true,
  cellNF: true,
  cellText: false,
  cellHTML: false,
  cellFormula: false,
  cellStyles: false,
  bookVBA: false,
};

class ReadFailure extends Error {
  constructor(code, status, message, details) {
    super(message);
    this.code = code;
    this.status = status;
    this.details = details;
  }
}

/** Columns that grow as parts of the sheet arrive: kinds, values and each column's distinct texts. */
function createColumns(capacity, limits) {
  const kinds = [];
  const values = [];
  const texts = [];
  const textIds = [];
  let size = Math.max(16, capacity);
  let height = 0;
  let errorCells = 0;
  let hasData = false;
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
  const grow = (rows) => {
    let next = size;
    while (next < rows) next *= 2;
    if (next === size) return;
    for (let c = 0; c < kinds.length; c += 1) {
      const k = new Uint8Array(next);
      k.set(kinds[c]);
      kinds[c] = k;
      const v = new Float64Array(next);
      v.set(values[c]);
      values[c] = v;
    }
    size = next;
  };
  const widen = (width, sheetName) => {
    if (width > limits.maxColumns + 50) {
      throw new ReadFailure(
        'too_many_columns',
        413,
        `The sheet "${sheetName}" has ${width} columns; the limit is ${limits.maxColumns}. Remove columns you do not need and upload again.`,
        { columns: width, limit: limits.maxColumns },
      );
    }
    while (kinds.length < width) {
      kinds.push(new Uint8Array(size));
      values.push(new Float64Array(size));
      texts.push([]);
      textIds.push(new Map());
    }
  };
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
  return {
    /** Adds the rows of a dense sheet (sparse arrays indexed by the rows' own numbers). */
    add(rows, sheetName) {
      for (let r = 0; r < rows.length; r += 1) {
        const row = rows[r];
        if (!Array.isArray(row)) continue;
        if (r >= limits.rowLimit) {
          throw new ReadFailure(
            'too_many_rows',
            413,
            `The sheet "${sheetName}" has more than ${limits.maxRows} rows, the limit. Split the export and upload the parts as separate datasets.`,
            { limit: limits.maxRows },
          );
        }
        if (row.length > kinds.length) widen(row.length, sheetName);
        if (r >= size) grow(r + 1);
        if (r >= height) height = r + 1;
        for (let c = 0; c < row.length; c += 1) {
          const cell = row[c];
          if (!cell) continue;
          const value = cell.v;
          if (value !== undefined && value !== null && value !== '') hasData = true;
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
    },
    get hasData() {
      return hasData;
    },
    /** The columns trimmed to the sheet's height, ready to move to the caller's thread. */
    finish() {
      const trim = (array) => (array.length === height ? array : array.slice(0, height));
      return {
        kinds: kinds.map(trim),
        values: values.map(trim),
        texts,
        height,
        errorCells,
      };
    },
  };
}

/** Checks a sheet before its cells are read: its stated size and merged cells. */
function checkSheet(sheet, sheetName, limits) {
  const fullRef = sheet['!fullref'];
  if (fullRef) {
    const rows = XLSX.utils.decode_range(fullRef).e.r + 1;
    if (rows > limits.rowLimit) {
      throw new ReadFailure(
        'too_many_rows',
        413,
        `The sheet "${sheetName}" has about ${rows} rows; the limit is ${limits.maxRows}. Split the export and upload the parts as separate datasets.`,
        { rows, limit: limits.maxRows },
      );
    }
  }
  const merges = sheet['!merges'] || [];
  if (merges.length > 0) {
    const ranges = merges.slice(0, 20).map((range) => XLSX.utils.encode_range(range));
    throw new ReadFailure(
      'merged_cells',
      422,
      `The sheet "${sheetName}" has merged cells (${ranges.join(', ')}${merges.length > 20 ? ', …' : ''}). Unmerge them so that every row has its own values, and upload again.`,
      { ranges, count: merges.length },
    );
  }
}

function sheetNotFound(wantedSheet, sheetNames) {
  return new ReadFailure(
    'sheet_not_found',
    422,
    `The workbook has no sheet named "${wantedSheet}". Choose one of: ${sheetNames.join(', ')}.`,
    { sheetNames },
  );
}

function noData(sheetNames) {
  return new ReadFailure(
    'file_empty',
    422,
    'The workbook has no data in any sheet. Export the staff list again and upload it.',
    { sheetNames },
  );
}

/** The whole workbook in one read: small workbooks, and anything the part reader does not handle. */
function readWhole(bytes, wantedSheet, limits) {
  let workbook;
  try {
    workbook = XLSX.read(bytes, { ...READ_OPTIONS, sheetRows: limits.rowLimit });
  } catch (error) {
    const text = String(error?.message ?? error);
    if (/password|encrypt/i.test(text)) {
      throw new ReadFailure(
        'workbook_encrypted',
        422,
        'The workbook is password-protected, so it cannot be read. Open it, remove the password, save it as .xlsx and upload it again.',
      );
    }
    throw new ReadFailure(
      'workbook_unreadable',
      422,
      'The workbook could not be read. Open it in your spreadsheet program, save it as .xlsx again and upload it.',
      { reason: text.slice(0, 200) },
    );
  }
  const sheetNames = workbook.SheetNames.slice();
  let sheetName;
  if (wantedSheet) {
    if (!sheetNames.includes(wantedSheet)) throw sheetNotFound(wantedSheet, sheetNames);
    sheetName = wantedSheet;
  } else {
    sheetName = sheetNames.find((name) => hasData(workbook.Sheets[name]));
    if (!sheetName) throw noData(sheetNames);
  }
  const sheet = workbook.Sheets[sheetName];
  checkSheet(sheet, sheetName, limits);
  const rows = Array.isArray(sheet) ? sheet : [];
  const columns = createColumns(rows.length, limits);
  columns.add(rows, sheetName);
  return { sheetName, sheetNames, parts: 1, ...columns.finish() };
}

// --- Reading a large sheet in parts -------------------------------------------------------------

const WORKSHEET_PATH = /(^|\/)worksheets\/[^/]+\.xml$/i;
const MARKER = 'coppice-sheet-part:';

/** A stand-in for a worksheet that is not being read: one cell naming the worksheet's zip path. */
function markerSheet(path) {
  const text = `${MARKER}${path}`.replace(/&/g, '&amp;').replace(/</g, '&lt;');
  return Buffer.from(
    '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>' +
      '<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>' +
      `<row r="1"><c r="A1" t="inlineStr"><is><t>${text}</t></is></c></row></sheetData></worksheet>`,
  );
}

const SPACE = new Set([0x20, 0x09, 0x0a, 0x0d, 0x3e, 0x2f]); // space, tab, LF, CR, '>', '/'

/**
 * Cuts a worksheet's XML at row boundaries: the part before the rows, the part after them, and the
 * byte offsets where parts start. Null where the layout is not the plain one (then: whole read).
 */
function cutRows(xml, partBytes) {
  const at = xml.indexOf('sheetData');
  if (at < 0) return null;
  const lt = xml.lastIndexOf('<', at);
  if (lt < 0 || at - lt > 16) return null;
  const prefix = xml.subarray(lt + 1, at).toString('latin1'); // '' or a namespace prefix such as 'x:'
  if (!/^([A-Za-z_][\w.-]*:)?$/.test(prefix)) return null;
  const gt = xml.indexOf('>', at);
  if (gt < 0) return null;
  const rowsStart = gt + 1;
  if (xml[gt - 1] === 0x2f) {
    // <sheetData/>: no rows, one part (the sheet as it is)
    return {
      head: xml.subarray(0, rowsStart),
      tail: xml.subarray(rowsStart),
      starts: [rowsStart],
      rowsEnd: rowsStart,
    };
  }
  const rowsEnd = xml.lastIndexOf(`</${prefix}sheetData`);
  if (rowsEnd < rowsStart) return null;
  const rowTag = Buffer.from(`<${prefix}row`, 'latin1');
  const nextRow = (from) => {
    let i = xml.indexOf(rowTag, from);
    while (i >= 0 && i < rowsEnd && !SPACE.has(xml[i + rowTag.length])) i = xml.indexOf(rowTag, i + 1);
    return i >= 0 && i < rowsEnd ? i : -1;
  };
  const starts = [rowsStart];
  for (let next = nextRow(rowsStart + partBytes); next >= 0; next = nextRow(next + partBytes)) {
    // A later part must say which row it starts at: rows without numbers would restart at 1.
    const tagEnd = xml.indexOf('>', next);
    const tag = xml.subarray(next, tagEnd < 0 ? rowsEnd : tagEnd).toString('latin1');
    if (!/\sr\s*=\s*["']\d+["']/.test(tag)) return null;
    starts.push(next);
  }
  return { head: xml.subarray(0, rowsStart), tail: xml.subarray(rowsEnd), starts, rowsEnd };
}

/** Reads the sheet at `path` part by part into columns; the caller decides whether it has data. */
function readInParts(files, path, sheetName, cut, limits, capacity) {
  const columns = createColumns(capacity, limits);
  const xml = files[path];
  for (let p = 0; p < cut.starts.length; p += 1) {
    const end = p + 1 < cut.starts.length ? cut.starts[p + 1] : cut.rowsEnd;
    const part = Buffer.concat([cut.head, xml.subarray(cut.starts[p], end), cut.tail]);
    const zip = zipSync({ ...files, [path]: part }, { level: 0 });
    const workbook = XLSX.read(zip, READ_OPTIONS);
    const sheet = workbook.Sheets[sheetName];
    if (!sheet) throw new Error(`part ${p} lost the sheet`);
    if (p === 0) checkSheet(sheet, sheetName, limits);
    columns.add(Array.isArray(sheet) ? sheet : [], sheetName);
  }
  return columns;
}

/** The number of the sheet's last row, from its XML (a first guess at the columns' height). */
function lastRowNumber(xml, cut) {
  const tail = xml.subarray(cut.starts[cut.starts.length - 1], cut.rowsEnd).toString('latin1');
  const all = tail.match(/<(?:[\w.-]+:)?row\s[^>]*?\br\s*=\s*["'](\d+)["']/g);
  const last = all?.[all.length - 1];
  const number = last ? Number(/(\d+)["']$/.exec(last)?.[1]) : 0;
  return Number.isFinite(number) ? number : 0;
}

/** The large-sheet path; null where it does not apply (small sheets, unusual layouts). */
function readLarge(bytes, wantedSheet, limits) {
  let files;
  try {
    files = unzipSync(bytes);
  } catch {
    return null; // the whole read gives the proper error
  }
  for (const [name, data] of Object.entries(files))
    files[name] = Buffer.from(data.buffer, data.byteOffset, data.byteLength);
  const worksheets = Object.keys(files).filter((name) => WORKSHEET_PATH.test(name));
  const largest = Math.max(0, ...worksheets.map((name) => files[name].byteLength));
  if (largest <= limits.partBytes) return null;

  // Which worksheet is which sheet: read the workbook with every worksheet replaced by a marker.
  const markers = Object.fromEntries(worksheets.map((name) => [name, markerSheet(name)]));
  const frame = XLSX.read(zipSync({ ...files, ...markers }, { level: 0 }), READ_OPTIONS);
  const sheetNames = frame.SheetNames.slice();
  const pathOf = new Map();
  for (const name of sheetNames) {
    const value = frame.Sheets[name]?.[0]?.[0]?.v;
    if (typeof value === 'string' && value.startsWith(MARKER)) pathOf.set(name, value.slice(MARKER.length));
  }
  if (wantedSheet && !sheetNames.includes(wantedSheet)) throw sheetNotFound(wantedSheet, sheetNames);
  const candidates = wantedSheet ? [wantedSheet] : sheetNames;
  for (const sheetName of candidates) {
    const path = pathOf.get(sheetName);
    if (!path) return null;
    const xml = files[path];
    const cut = cutRows(xml, limits.partBytes);
    if (!cut) return null;
    // Other worksheets stay markers while this one is read: only its parts are parsed.
    const others = { ...files, ...markers };
    others[path] = xml;
    const columns = readInParts(others, path, sheetName, cut, limits, lastRowNumber(xml, cut));
    if (wantedSheet || columns.hasData) {
      return { sheetName, sheetNames, parts: cut.starts.length, ...columns.finish() };
    }
  }
  throw noData(sheetNames);
}

function run() {
  // Yields the CPU to the thread that answers requests (on Linux the nice value is per thread).
  if (process.platform === 'linux') {
    try {
      os.setPriority(0, 10);
    } catch {
      // not allowed here: read at normal priority
    }
  }
  const { sheet: wantedSheet, maxRows, maxColumns, partBytes } = workerData;
  const bytes = workerData.bytes;
  workerData.bytes = null; // the unpacked parts replace it
  // header and blank rows above it
  const limits = { maxRows, maxColumns, rowLimit: maxRows + 100, partBytes };
  try {
    let read = null;
    try {
      read = readLarge(bytes, wantedSheet, limits);
    } catch (error) {
      if (error instanceof ReadFailure) throw error;
      read = null; // something the part reader did not expect: the whole read decides
    }
    read ??= readWhole(bytes, wantedSheet, limits);
    parentPort.postMessage({ ok: true, ...read }, [
      ...read.kinds.map((column) => column.buffer),
      ...read.values.map((column) => column.buffer),
    ]);
  } catch (error) {
    if (error instanceof ReadFailure) fail(error.code, error.status, error.message, error.details);
    else throw error;
  }
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
