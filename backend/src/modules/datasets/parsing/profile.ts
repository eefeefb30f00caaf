import type { ColumnProfile } from '../../../../../shared/datasets';
import { flagColumn } from './flags';
import type { TypedColumn, TypedTable } from './type-columns';

// Enough for the mapping form to offer every reason or flag value as a checkbox.
const TOP_CATEGORIES = 50;

/**
 * Median of the values counted in `counts`, given their distinct values in ascending order: the
 * mean of the two middle values for numbers, the lower middle one for dates (ISO text).
 */
function medianOfCounted<T extends number | string>(
  sortedKeys: ArrayLike<T>,
  counts: Map<string | number, number>,
  total: number,
): T {
  const lower = Math.floor((total - 1) / 2);
  const wanted = typeof sortedKeys[0] === 'number' && total % 2 === 0 ? lower + 1 : lower;
  let seen = 0;
  let lowerValue: T | undefined;
  for (let i = 0; i < sortedKeys.length; i += 1) {
    const key = sortedKeys[i];
    seen += counts.get(key) ?? 0;
    if (lowerValue === undefined && seen > lower) lowerValue = key;
    if (seen > wanted) {
      return (wanted === lower ? key : ((lowerValue as number) + (key as number)) / 2) as T;
    }
  }
  return sortedKeys[sortedKeys.length - 1];
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
  // Ranges and medians from the distinct values and their counts: far fewer to sort than rows.
  const present = column.values.length - missing;
  if (column.type === 'number') {
    const sorted = Float64Array.from(counts.keys() as IterableIterator<number>).sort();
    if (sorted.length > 0) {
      profile.min = sorted[0];
      profile.max = sorted[sorted.length - 1];
      profile.median = medianOfCounted(sorted, counts, present);
    }
  } else if (column.type === 'date') {
    profile.dateOrder = column.dateOrder;
    if (column.dateOrder !== 'ambiguous') {
      const sorted = [...(counts.keys() as IterableIterator<string>)].sort();
      if (sorted.length > 0) {
        profile.min = sorted[0];
        profile.max = sorted[sorted.length - 1];
        profile.median = medianOfCounted(sorted, counts, present);
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
