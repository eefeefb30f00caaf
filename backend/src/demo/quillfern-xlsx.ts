import XLSX from 'xlsx';
import { QUILLFERN_NOTE, type QuillfernExport } from './quillfern';

const EPOCH = Date.UTC(1899, 11, 30);

/**
 * The export as an XLSX workbook: dates as real date cells (1900-system serials), and a second
 * sheet with the note that everything is invented. Our own generated data, so the xlsx writer
 * runs in-process here; untrusted workbooks are only ever read inside the intake worker.
 */
export function quillfernXlsx(data: QuillfernExport): Uint8Array {
  const dateColumns = new Set(data.header.map((name, c) => (data.dateColumns.includes(name) ? c : -1)));
  const sheet: XLSX.WorkSheet = {};
  const put = (r: number, c: number, cell: XLSX.CellObject) => {
    sheet[XLSX.utils.encode_cell({ r, c })] = cell;
  };
  data.header.forEach((name, c) => {
    put(0, c, { t: 's', v: name });
  });
  data.rows.forEach((row, r) => {
    row.forEach((value, c) => {
      if (value === null) return;
      if (dateColumns.has(c) && typeof value === 'string') {
        put(r + 1, c, { t: 'n', v: (Date.parse(value) - EPOCH) / 86_400_000, z: 'yyyy-mm-dd' });
      } else {
        put(r + 1, c, typeof value === 'number' ? { t: 'n', v: value } : { t: 's', v: value });
      }
    });
  });
  sheet['!ref'] = XLSX.utils.encode_range({
    s: { r: 0, c: 0 },
    e: { r: data.rows.length, c: data.header.length - 1 },
  });
  const book = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(book, sheet, 'Staff');
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet([['Note'], [QUILLFERN_NOTE]]), 'Note');
  return new Uint8Array(XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }));
}
