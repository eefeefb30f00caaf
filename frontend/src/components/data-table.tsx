import { type ReactNode, useMemo, useState } from 'react';

export type SortValue = number | string | null | undefined;

export type DataTableColumn<T> = {
  /** unique within the table */
  key: string;
  header: string;
  cell: (row: T) => ReactNode;
  /** makes the column sortable; null and undefined sort last */
  sortValue?: (row: T) => SortValue;
  align?: 'left' | 'right';
};

export type SortState = { key: string; direction: 'ascending' | 'descending' };

export type DataTableProps<T> = {
  /** read by screen readers; shown unless `hideCaption` */
  caption: string;
  hideCaption?: boolean;
  columns: DataTableColumn<T>[];
  rows: readonly T[];
  rowKey: (row: T) => string;
  initialSort?: SortState;
  /** shown in place of the rows when there are none */
  empty?: ReactNode;
};

function compare(a: SortValue, b: SortValue): number {
  if (a === b) return 0;
  if (a === null || a === undefined) return 1;
  if (b === null || b === undefined) return -1;
  if (typeof a === 'number' && typeof b === 'number') return a - b;
  return String(a).localeCompare(String(b), 'en', { numeric: true });
}

export function sortRows<T>(
  rows: readonly T[],
  column: DataTableColumn<T> | undefined,
  sort?: SortState,
): T[] {
  if (!sort || !column?.sortValue) return [...rows];
  const value = column.sortValue;
  const sign = sort.direction === 'ascending' ? 1 : -1;
  return [...rows].sort((a, b) => {
    const va = value(a);
    const vb = value(b);
    // Missing values stay last whichever way the column is sorted.
    if (va === null || va === undefined || vb === null || vb === undefined) return compare(va, vb);
    return sign * compare(va, vb);
  });
}

export function DataTable<T>({
  caption,
  hideCaption = false,
  columns,
  rows,
  rowKey,
  initialSort,
  empty = 'Nothing to show yet.',
}: DataTableProps<T>) {
  const [sort, setSort] = useState<SortState | undefined>(initialSort);
  const sorted = useMemo(
    () =>
      sortRows(
        rows,
        columns.find((c) => c.key === sort?.key),
        sort,
      ),
    [rows, columns, sort],
  );

  function toggle(key: string) {
    setSort((current) =>
      current?.key === key
        ? { key, direction: current.direction === 'ascending' ? 'descending' : 'ascending' }
        : { key, direction: 'ascending' },
    );
  }

  return (
    <div className="overflow-x-auto rounded-lg border border-sand-200 bg-white">
      <table className="w-full border-collapse text-sm">
        <caption className={hideCaption ? 'sr-only' : 'px-4 py-2 text-left font-medium text-slate-700'}>
          {caption}
        </caption>
        <thead className="bg-sand-100 text-slate-700">
          <tr>
            {columns.map((column) => {
              const active = sort?.key === column.key;
              const alignment = column.align === 'right' ? 'text-right' : 'text-left';
              return (
                <th
                  key={column.key}
                  scope="col"
                  aria-sort={active ? sort.direction : column.sortValue ? 'none' : undefined}
                  className={`px-4 py-2 font-semibold ${alignment}`}
                >
                  {column.sortValue ? (
                    <button
                      type="button"
                      onClick={() => toggle(column.key)}
                      className="inline-flex items-center gap-1 rounded hover:text-moss-800"
                    >
                      {column.header}
                      <span aria-hidden="true" className="text-xs text-slate-500">
                        {active ? (sort.direction === 'ascending' ? '▲' : '▼') : '↕'}
                      </span>
                    </button>
                  ) : (
                    column.header
                  )}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody>
          {sorted.length === 0 ? (
            <tr>
              <td colSpan={columns.length} className="px-4 py-6 text-center text-slate-500">
                {empty}
              </td>
            </tr>
          ) : (
            sorted.map((row) => (
              <tr key={rowKey(row)} className="border-t border-sand-100 even:bg-sand-50/60">
                {columns.map((column) => (
                  <td
                    key={column.key}
                    className={`px-4 py-2 ${column.align === 'right' ? 'text-right tabular-nums' : ''}`}
                  >
                    {column.cell(row)}
                  </td>
                ))}
              </tr>
            ))
          )}
        </tbody>
      </table>
    </div>
  );
}
