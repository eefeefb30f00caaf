import type { ColumnProfile } from '../../../../../shared/datasets';
import { flagColumn } from './flags';
import type { TypedColumn, TypedTable } from './type-columns';

// Enough for the mapping form to offer every reason or flag value as a checkbox.
const TOP_CATEGORIES = 50;

function medianOfSorted<T extends number | string>(sorted: T[]): T {
  const middle = Math.floor((sorted.length - 1) / 2);
  if (typeof sorted[0] === 'number' && sorted.length % 2 === 0) {
    return (((sorted[middle] as number) + (sorted[middle + 1] as number)) / 2) as T;
  }
  return sorted[middle];
}

export function profileColumn(column: TypedColumn, rowCount: number): ColumnProfile {
  let missing = 0;
  const counts = new Map<string | number, number>();
  for (const value of column.values) {
    if (value === null) missing += 1;
    else counts.set(value, (counts.get(value) ?? 0) + 1);
  }
  const profile: ColumnProfile = {
    name: column.name,
    type: column.type,
    missingShare: rowCount === 0 ? 0 : missing / rowCount,
    distinct: counts.size,
  };
  if (column.type === 'number') {
    const sorted = Float64Array.from(column.values.filter((v): v is number => v !== null)).sort();
    if (sorted.length > 0) {
      profile.min = sorted[0];
      profile.max = sorted[sorted.length - 1];
      profile.median = medianOfSorted(Array.from(sorted));
    }
  } else if (column.type === 'date') {
    profile.dateOrder = column.dateOrder;
    if (column.dateOrder !== 'ambiguous') {
      const sorted = column.values.filter((v): v is string => v !== null).sort();
      if (sorted.length > 0) {
        profile.min = sorted[0];
        profile.max = sorted[sorted.length - 1];
        profile.median = medianOfSorted(sorted);
      }
    }
  } else if (column.type === 'category' || column.type === 'yes-no') {
    profile.topCategories = [...counts.entries()]
      .sort((a, b) => b[1] - a[1] || String(a[0]).localeCompare(String(b[0])))
      .slice(0, TOP_CATEGORIES)
      .map(([value, count]) => ({ value: String(value), count }));
  }
  return { ...profile, ...flagColumn(column) };
}

/** Per-column profile of a typed table: type, missing share, distinct count, ranges, top values and flags. */
export function profileTable(table: TypedTable): ColumnProfile[] {
  return table.columns.map((column) => profileColumn(column, table.rowNumbers.length));
}
