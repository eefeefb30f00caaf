/**
 * The columnar table the engine trains on: numeric columns as Float64Array (NaN = missing),
 * categorical columns as integer codes into a level list (-1 = missing). Built once from plain
 * arrays; everything downstream works on typed arrays.
 */

export type NumericColumn = { kind: 'numeric'; name: string; values: Float64Array };
export type CategoricalColumn = { kind: 'categorical'; name: string; codes: Int32Array; levels: string[] };
export type Column = NumericColumn | CategoricalColumn;

export type Table = { rowCount: number; columns: Column[] };

export const MISSING_CODE = -1;

export type ColumnInput =
  | { name: string; kind: 'numeric'; values: ArrayLike<number | null | undefined> }
  | { name: string; kind: 'categorical'; values: ArrayLike<string | null | undefined> };

export function numericColumn(name: string, values: ArrayLike<number | null | undefined>): NumericColumn {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    out[i] = v === null || v === undefined || !Number.isFinite(v) ? Number.NaN : v;
  }
  return { kind: 'numeric', name, values: out };
}

/** Levels are sorted so that the same data always gives the same codes. */
export function categoricalColumn(
  name: string,
  values: ArrayLike<string | null | undefined>,
  levels?: string[],
): CategoricalColumn {
  const levelList =
    levels ??
    [...new Set(Array.from(values).filter((v): v is string => typeof v === 'string' && v !== ''))].sort();
  const index = new Map(levelList.map((level, i) => [level, i]));
  const codes = new Int32Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    codes[i] = typeof v === 'string' ? (index.get(v) ?? MISSING_CODE) : MISSING_CODE;
  }
  return { kind: 'categorical', name, codes, levels: levelList };
}

export function buildTable(columns: ColumnInput[]): Table {
  const rowCount = columns.length === 0 ? 0 : columns[0].values.length;
  const names = new Set<string>();
  const built = columns.map((c) => {
    if (c.values.length !== rowCount) {
      throw new Error(`Column "${c.name}" has ${c.values.length} values, expected ${rowCount}`);
    }
    if (names.has(c.name)) throw new Error(`Column "${c.name}" appears twice`);
    names.add(c.name);
    return c.kind === 'numeric' ? numericColumn(c.name, c.values) : categoricalColumn(c.name, c.values);
  });
  return { rowCount, columns: built };
}

export function getColumn(table: Table, name: string): Column {
  const column = table.columns.find((c) => c.name === name);
  if (!column) throw new Error(`Unknown column "${name}"`);
  return column;
}

/** A table with the same columns restricted to some rows (categorical levels are kept). */
export function selectRows(table: Table, rows: ArrayLike<number>): Table {
  const columns = table.columns.map((c): Column => {
    if (c.kind === 'numeric') {
      const values = new Float64Array(rows.length);
      for (let i = 0; i < rows.length; i++) values[i] = c.values[rows[i]];
      return { kind: 'numeric', name: c.name, values };
    }
    const codes = new Int32Array(rows.length);
    for (let i = 0; i < rows.length; i++) codes[i] = c.codes[rows[i]];
    return { kind: 'categorical', name: c.name, codes, levels: c.levels };
  });
  return { rowCount: rows.length, columns };
}

/** A 0/1 label from booleans, numbers or strings; `isPositive` decides for strings and numbers. */
export function toLabel<T>(values: ArrayLike<T>, isPositive: (value: T) => boolean): Uint8Array {
  const out = new Uint8Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = isPositive(values[i]) ? 1 : 0;
  return out;
}
