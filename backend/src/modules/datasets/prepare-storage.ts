import type { ColumnProfile } from '../../../../shared/datasets';
import { hashEmployeeId } from './employee-id-hash';
import { MANAGER_HEADER } from './parsing/flags';
import type { ParsedUpload } from './parsing/parse-upload';
import type { TypedColumn } from './parsing/type-columns';

export type StoredColumn = {
  position: number;
  name: string;
  type: TypedColumn['type'];
  dateOrder: string | null;
  /**
   * The column's values (string | number | null, row order) as JSON text: a worker thread hands a
   * string over far more cheaply than an array, and it goes to the JSONB column as it is.
   */
  valuesJson: string;
};

export type PreparedDataset = {
  columns: StoredColumn[];
  profile: ColumnProfile[];
  dropped: { name: string; reason: string }[];
  rowNumbers: number[];
};

const FREE_TEXT_REASON = 'free text is not used by the models and may hold personal details';

function withoutValues(profile: ColumnProfile): ColumnProfile {
  const { min: _min, median: _median, max: _max, topCategories: _top, ...rest } = profile;
  return rest;
}

/**
 * What may be stored of a parsed upload: direct identifiers and free text are dropped (their
 * profile keeps no values), identifier columns such as the employee ID are replaced by keyed
 * hashes (except a manager e-mail column), everything else is kept as typed values.
 */
export function prepareForStorage(parsed: ParsedUpload, secret: string): PreparedDataset {
  const columns: StoredColumn[] = [];
  const dropped: { name: string; reason: string }[] = [];
  const profile = parsed.profile.map((column, i) => {
    const typed = parsed.table.columns[i];
    if (column.directIdentifier || column.type === 'free-text') {
      dropped.push({ name: column.name, reason: column.directIdentifier?.reason ?? FREE_TEXT_REASON });
      return { ...withoutValues(column), storage: 'not-stored' as const };
    }
    // A manager e-mail column stays readable: it is how managers are matched to their teams.
    const hashed = typed.type === 'identifier' && !MANAGER_HEADER.test(typed.name);
    const values = hashed
      ? typed.values.map((value) => (value === null ? null : hashEmployeeId(secret, String(value))))
      : typed.values;
    columns.push({
      position: i,
      name: typed.name,
      type: typed.type,
      dateOrder: typed.type === 'date' ? typed.dateOrder : null,
      valuesJson: JSON.stringify(values),
    });
    return { ...column, storage: hashed ? ('keyed-hash' as const) : ('values' as const) };
  });
  return { columns, profile, dropped, rowNumbers: parsed.table.rowNumbers };
}
