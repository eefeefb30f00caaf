import XLSX from 'xlsx';

// Builds small workbooks in memory for the tests (our own data, so the writer may run in-process).
export type SheetSpec = { name: string; rows: unknown[][]; merges?: string[]; dateCells?: string[] };

export function workbookBytes(sheets: SheetSpec[]): Uint8Array {
  const book = XLSX.utils.book_new();
  for (const spec of sheets) {
    const sheet = XLSX.utils.aoa_to_sheet(spec.rows);
    if (spec.merges) sheet['!merges'] = spec.merges.map((range) => XLSX.utils.decode_range(range));
    for (const address of spec.dateCells ?? []) {
      const cell = sheet[address];
      if (cell) cell.z = 'dd/mm/yyyy';
    }
    XLSX.utils.book_append_sheet(book, sheet, spec.name);
  }
  return new Uint8Array(XLSX.write(book, { type: 'buffer', bookType: 'xlsx' }));
}

/** An OLE compound file with the streams an encrypted workbook has. */
export function encryptedWorkbookBytes(): Uint8Array {
  const cfb = XLSX.CFB.utils.cfb_new();
  XLSX.CFB.utils.cfb_add(cfb, '/EncryptionInfo', Buffer.alloc(64, 1));
  XLSX.CFB.utils.cfb_add(cfb, '/EncryptedPackage', Buffer.alloc(4096, 7));
  return new Uint8Array(XLSX.CFB.write(cfb, { type: 'buffer' }) as Buffer);
}

export function csvBytes(text: string): Uint8Array {
  return new Uint8Array(Buffer.from(text, 'utf8'));
}
