import { strToU8, zipSync } from 'fflate';
import XLSX from 'xlsx';

// Hostile uploads built in memory. Sizes stay modest: each proves a guard, not the machine's limits.
export type HostileFile = { label: string; name: string; bytes: Uint8Array };

export function smallWorkbook(rows: unknown[][]): Uint8Array {
  const book = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(rows), 'Staff');
  return new Uint8Array(XLSX.write(book, { type: 'buffer', bookType: 'xlsx' }));
}

export const VALID_ROWS = [
  ['Staff No', 'Crew', 'Line Manager Email', 'Left'],
  ...Array.from({ length: 12 }, (_, i) => [
    `Q${1000 + i}`,
    i % 2 ? 'North' : 'South',
    'm@quillfern.example',
    i % 3 ? 'No' : 'Yes',
  ]),
];

export function validCsv(): Uint8Array {
  return strToU8(`${VALID_ROWS.map((r) => r.join(',')).join('\n')}\n`);
}

const CONTENT_TYPES =
  '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/></Types>';
const RELS =
  '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/></Relationships>';
const WORKBOOK =
  '<?xml version="1.0" encoding="UTF-8"?><workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"><sheets><sheet name="Staff" sheetId="1" r:id="rId1"/></sheets></workbook>';
const WORKBOOK_RELS =
  '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/></Relationships>';

/** A workbook package written by hand around the given sheet XML. */
export function workbookAround(sheetXml: string | Uint8Array): Uint8Array {
  return zipSync({
    '[Content_Types].xml': strToU8(CONTENT_TYPES),
    '_rels/.rels': strToU8(RELS),
    'xl/workbook.xml': strToU8(WORKBOOK),
    'xl/_rels/workbook.xml.rels': strToU8(WORKBOOK_RELS),
    'xl/worksheets/sheet1.xml': typeof sheetXml === 'string' ? strToU8(sheetXml) : sheetXml,
  });
}

/** Files that are not a usable staff export: each must be refused with a 4xx and store nothing. */
export function malformedFiles(): HostileFile[] {
  const workbook = smallWorkbook(VALID_ROWS);
  const corrupted = workbook.slice();
  // Overwrite the middle of the package (local headers and compressed data) with noise.
  for (let i = Math.floor(corrupted.length / 3); i < Math.floor((2 * corrupted.length) / 3); i++)
    corrupted[i] = (i * 7919) & 0xff;
  const nested = `<?xml version="1.0"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${'<row>'.repeat(50_000)}${'</row>'.repeat(50_000)}</sheetData></worksheet>`;
  const bombSheet = new Uint8Array(60 * 1024 * 1024).fill(0x20);
  const header = 'Staff No,Crew,Line Manager Email,Left\n';
  return [
    {
      label: 'a truncated workbook',
      name: 'staff.xlsx',
      bytes: workbook.slice(0, Math.floor(workbook.length / 2)),
    },
    { label: 'a workbook with its middle overwritten', name: 'staff.xlsx', bytes: corrupted },
    { label: 'a zip of nothing', name: 'staff.xlsx', bytes: zipSync({}) },
    { label: 'deeply nested XML in a sheet', name: 'staff.xlsx', bytes: workbookAround(nested) },
    {
      label: 'a zip bomb (60 MB of spaces in a sheet)',
      name: 'staff.xlsx',
      bytes: workbookAround(bombSheet),
    },
    {
      label: 'an XML entity expansion in a sheet',
      name: 'staff.xlsx',
      bytes: workbookAround(
        `<?xml version="1.0"?><!DOCTYPE s [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;"><!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;"><!ENTITY d "&c;&c;&c;&c;&c;&c;&c;&c;&c;&c;">]><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>&d;&d;&d;&d;</t></is></c></row></sheetData></worksheet>`,
      ),
    },
    {
      label: 'a million empty rows',
      name: 'staff.csv',
      bytes: strToU8(header + ',,,\n'.repeat(1_000_000)),
    },
    {
      label: 'a CSV with an unbalanced quote',
      name: 'staff.csv',
      bytes: strToU8(`${header}Q1,North,"m@quillfern.example,No\nQ2,South,m@quillfern.example,Yes\n`),
    },
    { label: 'an empty file', name: 'staff.csv', bytes: new Uint8Array(0) },
    {
      label: 'a PNG named .csv',
      name: 'staff.csv',
      bytes: new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]),
    },
    {
      label: 'a header only',
      name: 'staff.csv',
      bytes: strToU8(header),
    },
  ];
}

/**
 * Well-formed exports with hostile content: refusing them is fine; if they are stored, the header
 * must come out without control characters or direction marks (checked by the test).
 */
export function hostileContentFiles(): HostileFile[] {
  const formulaRows = [
    ['Staff No', 'Crew', 'Line Manager Email', 'Left', 'Note'],
    ...Array.from({ length: 12 }, (_, i) => [
      `Q${2000 + i}`,
      ['=HYPERLINK("http://attacker.example","x")', '+1+1', '-2+3', '@SUM(A1)'][i % 4],
      'm@quillfern.example',
      i % 2 ? 'No' : 'Yes',
      "=cmd|' /C calc'!A0",
    ]),
  ];
  const rlo = '\u202E';
  const headerRows = [
    [`Staff${rlo}oN`, 'Cr\u0000ew', 'Line\u0007Manager\u001bEmail', `\u200FLeft\u2066`],
    ...VALID_ROWS.slice(1),
  ];
  const hugeCell = 'y'.repeat(3 * 1024 * 1024);
  return [
    {
      label: 'formula cells in a CSV',
      name: 'staff.csv',
      bytes: strToU8(formulaRows.map((r) => r.map((v) => `"${v.replace(/"/g, '""')}"`).join(',')).join('\n')),
    },
    { label: 'formula cells in a workbook', name: 'staff.xlsx', bytes: smallWorkbook(formulaRows) },
    {
      label: 'control characters and direction marks in headers (CSV)',
      name: 'staff.csv',
      bytes: strToU8(headerRows.map((r) => r.join(',')).join('\n')),
    },
    {
      label: 'control characters and direction marks in headers (workbook)',
      name: 'staff.xlsx',
      bytes: smallWorkbook(
        headerRows.map((r) => r.map((v) => String(v).split(String.fromCharCode(0)).join(''))),
      ),
    },
    {
      label: 'a 3 MB cell',
      name: 'staff.csv',
      bytes: strToU8(
        `${VALID_ROWS[0].join(',')},Note\n${VALID_ROWS.slice(1)
          .map((r, i) => `${r.join(',')},${i === 0 ? hugeCell : 'ok'}`)
          .join('\n')}\n`,
      ),
    },
  ];
}
