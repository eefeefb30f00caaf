import type { ColumnProfile } from '../../../../../shared/datasets';
import { DEFAULT_LIMITS, type IntakeLimits, type RawTable } from './build-table';
import { detectFileFormat } from './detect-format';
import { parseCsv } from './parse-csv';
import { parseXlsx, tableFromWorkbook, type WorkbookRead } from './parse-xlsx';
import { profileTable } from './profile';
import { type TypedTable, typeColumns } from './type-columns';

export type ParsedUpload = {
  format: 'xlsx' | 'csv';
  table: TypedTable;
  profile: ColumnProfile[];
  warnings: string[];
  sheetName: string | null;
  sheetNames: string[];
};

/**
 * From the uploaded bytes to a typed, profiled table, or an IntakeError (nothing partial).
 * The type is decided by content; `sheet` picks a workbook sheet by name.
 */
export async function parseUpload(
  bytes: Uint8Array,
  options: {
    sheet?: string;
    limits?: Partial<IntakeLimits>;
  } = {},
): Promise<ParsedUpload> {
  const limits = { ...DEFAULT_LIMITS, ...options.limits };
  const detected = detectFileFormat(bytes);
  const raw =
    detected.kind === 'xlsx'
      ? await parseXlsx(bytes, limits, { sheet: options.sheet })
      : parseCsv(detected.text, limits, detected.warnings);
  return finishParse(detected.kind, raw);
}

/** The same as parseUpload for a workbook whose sheet was read already (readWorkbook). */
export function parseReadWorkbook(
  read: WorkbookRead,
  options: { limits?: Partial<IntakeLimits> } = {},
): ParsedUpload {
  return finishParse('xlsx', tableFromWorkbook(read, { ...DEFAULT_LIMITS, ...options.limits }));
}

function finishParse(format: 'xlsx' | 'csv', raw: RawTable): ParsedUpload {
  const table = typeColumns(raw);
  const profile = profileTable(table);
  const warnings = [...raw.warnings];
  for (const column of profile) {
    if (column.dateOrder === 'ambiguous') {
      warnings.push(
        `Every date in "${column.name}" fits both day-first and month-first (like 03/04/2025); say which in the mapping (dateOrder).`,
      );
    }
  }
  return {
    format,
    table,
    profile,
    warnings,
    sheetName: raw.sheetName ?? null,
    sheetNames: raw.sheetNames ?? [],
  };
}
