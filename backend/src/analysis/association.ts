/**
 * How strongly an allowed feature is associated with a blocked field (proxy warnings).
 *
 * Every column becomes a set of levels: categories as they are, numbers and dates cut into quantile
 * bins, a missing value as its own level. Between two such columns we build the contingency table
 * and report Pearson's χ² (no continuity correction), Cramér's V = √(χ² / (n·(min(r, c) − 1)))
 * (Cramér 1946) and the normalised mutual information (mutual information divided by the mean of
 * the two entropies, the arithmetic normalisation).
 */

export type Cell = string | number | boolean | Date | null | undefined;
export type ColumnKind = 'categorical' | 'numeric' | 'date';

export const DEFAULT_QUANTILE_BINS = 5;
export const MISSING_LEVEL = '(missing)';

export type Levels = {
  kind: ColumnKind;
  /** level index of every row */
  codes: Int32Array;
  labels: string[];
  /** number of quantile bins asked for (numbers and dates); null for categories */
  bins: number | null;
};

const ISO_DATE = /^\d{4}-\d{2}-\d{2}(?:[T ][\d:.]+(?:Z|[+-]\d{2}:?\d{2})?)?$/;

function isMissing(value: Cell): boolean {
  return value === null || value === undefined || (typeof value === 'string' && value.trim() === '');
}

function dateValue(value: Cell): number | null {
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : value.getTime();
  if (typeof value === 'string' && ISO_DATE.test(value.trim())) {
    const time = Date.parse(value.trim());
    return Number.isNaN(time) ? null : time;
  }
  return null;
}

/** Numbers if every present value is a finite number, dates if every one is a Date or an ISO date. */
export function inferKind(values: readonly Cell[]): ColumnKind {
  let numeric = true;
  let date = true;
  let present = 0;
  for (const value of values) {
    if (isMissing(value)) continue;
    present++;
    if (!(typeof value === 'number' && Number.isFinite(value))) numeric = false;
    if (dateValue(value) === null) date = false;
    if (!numeric && !date) return 'categorical';
  }
  if (present === 0) return 'categorical';
  return numeric ? 'numeric' : date ? 'date' : 'categorical';
}

/** The k-th smallest value (0-based) of `values`, reordering them in place (quickselect, O(n)). */
function select(values: Float64Array, k: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (lo < hi) {
    const pivot = values[(lo + hi) >>> 1]!;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i]! < pivot) i++;
      while (values[j]! > pivot) j--;
      if (i <= j) {
        const t = values[i]!;
        values[i] = values[j]!;
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return values[k]!;
  }
  return values[k]!;
}

/**
 * The inverted-CDF quantile (the smallest value with at least q of the values at or below it), so
 * every cut point is a value that occurs and no bin is empty.
 */
function quantile(values: Float64Array, q: number): number {
  return select(values, Math.max(0, Math.ceil(q * values.length) - 1));
}

function formatBound(value: number, kind: ColumnKind): string {
  if (kind === 'date') return new Date(value).toISOString().slice(0, 10);
  return Number.isInteger(value) ? String(value) : value.toPrecision(4);
}

/**
 * Cuts numbers (or dates, as times) into `bins` quantile bins, right-closed: (−∞, q1], (q1, q2], ….
 * Tied cut points are merged, so a column with few distinct values gets fewer bins.
 */
/** `values` holds NaN where a value is missing. */
function binNumbers(values: Float64Array, kind: ColumnKind, bins: number): Levels {
  let count = 0;
  let max = Number.NEGATIVE_INFINITY;
  let min = Number.POSITIVE_INFINITY;
  for (const value of values) {
    if (Number.isNaN(value)) continue;
    count++;
    if (value > max) max = value;
    if (value < min) min = value;
  }
  const present = new Float64Array(count);
  let next = 0;
  for (const value of values) if (!Number.isNaN(value)) present[next++] = value;
  const cuts: number[] = [];
  for (let i = 1; i < bins; i++) {
    const cut = quantile(present, i / bins);
    if (cut < max && (cuts.length === 0 || cut > cuts[cuts.length - 1]!)) cuts.push(cut);
  }
  const labels = cuts.length === 0 ? [`${formatBound(min, kind)} to ${formatBound(max, kind)}`] : [];
  if (cuts.length > 0) {
    labels.push(`up to ${formatBound(cuts[0]!, kind)}`);
    for (let i = 1; i < cuts.length; i++) {
      labels.push(`over ${formatBound(cuts[i - 1]!, kind)} up to ${formatBound(cuts[i]!, kind)}`);
    }
    labels.push(`over ${formatBound(cuts[cuts.length - 1]!, kind)}`);
  }
  const missingCode = count < values.length ? labels.push(MISSING_LEVEL) - 1 : -1;
  const codes = new Int32Array(values.length);
  const cutCount = cuts.length;
  for (let row = 0; row < values.length; row++) {
    const value = values[row]!;
    if (Number.isNaN(value)) {
      codes[row] = missingCode;
      continue;
    }
    let bin = 0;
    while (bin < cutCount && value > cuts[bin]!) bin++;
    codes[row] = bin;
  }
  return { kind, codes, labels, bins };
}

/** Turns one column into levels (see the module comment). */
export function toLevels(
  values: readonly Cell[],
  options: { kind?: ColumnKind; bins?: number } = {},
): Levels {
  const kind = options.kind ?? inferKind(values);
  const bins = options.bins ?? DEFAULT_QUANTILE_BINS;
  if (kind !== 'categorical') {
    const numbers = new Float64Array(values.length);
    let present = 0;
    for (let row = 0; row < values.length; row++) {
      const value = values[row];
      const number =
        kind === 'date'
          ? isMissing(value)
            ? null
            : dateValue(value)
          : typeof value === 'number' && Number.isFinite(value)
            ? value
            : null;
      numbers[row] = number ?? Number.NaN;
      if (number !== null) present++;
    }
    if (present > 0) return binNumbers(numbers, kind, bins);
  }
  const index = new Map<string, number>();
  const labels: string[] = [];
  const codes = new Int32Array(values.length);
  values.forEach((value, row) => {
    const label = isMissing(value)
      ? MISSING_LEVEL
      : value instanceof Date
        ? value.toISOString()
        : String(value);
    let code = index.get(label);
    if (code === undefined) {
      code = labels.length;
      index.set(label, code);
      labels.push(label);
    }
    codes[row] = code;
  });
  return { kind: 'categorical', codes, labels, bins: null };
}

/** Counts of rows per (level of a, level of b). */
export function contingencyTable(a: Levels, b: Levels): number[][] {
  if (a.codes.length !== b.codes.length) throw new Error('columns differ in length');
  const width = b.labels.length;
  const flat = new Float64Array(a.labels.length * width);
  const { codes: left } = a;
  const { codes: right } = b;
  for (let row = 0; row < left.length; row++) flat[left[row]! * width + right[row]!]!++;
  return a.labels.map((_, i) => Array.from(flat.subarray(i * width, (i + 1) * width)));
}

/** Drops rows and columns whose total is zero: a level nobody has carries no information. */
function nonEmpty(table: readonly (readonly number[])[]): number[][] {
  const columnTotals = table[0]?.map((_, j) => table.reduce((sum, row) => sum + row[j]!, 0)) ?? [];
  return table
    .filter((row) => row.some((count) => count > 0))
    .map((row) => row.filter((_, j) => columnTotals[j]! > 0));
}

export type ChiSquare = { chiSquare: number; dof: number; expected: number[][]; n: number };

/** Pearson's χ² test of independence, without continuity correction. */
export function chiSquare(observed: readonly (readonly number[])[]): ChiSquare {
  const table = nonEmpty(observed);
  const rowTotals = table.map((row) => row.reduce((a, b) => a + b, 0));
  const columnTotals = table[0]?.map((_, j) => table.reduce((sum, row) => sum + row[j]!, 0)) ?? [];
  const n = rowTotals.reduce((a, b) => a + b, 0);
  const expected = rowTotals.map((r) => columnTotals.map((c) => (r * c) / n));
  let statistic = 0;
  for (let i = 0; i < table.length; i++) {
    for (let j = 0; j < columnTotals.length; j++) {
      const e = expected[i]![j]!;
      statistic += (table[i]![j]! - e) ** 2 / e;
    }
  }
  const dof = Math.max(0, (table.length - 1) * (columnTotals.length - 1));
  return { chiSquare: n > 0 ? statistic : 0, dof, expected, n };
}

/** Cramér's V in [0, 1]; 0 when either side has a single level (nothing to associate). */
export function cramersV(observed: readonly (readonly number[])[]): number {
  const table = nonEmpty(observed);
  const r = table.length;
  const c = table[0]?.length ?? 0;
  if (Math.min(r, c) < 2) return 0;
  const { chiSquare: x2, n } = chiSquare(table);
  return Math.min(1, Math.sqrt(x2 / (n * (Math.min(r, c) - 1))));
}

function entropyBits(counts: readonly number[], n: number): number {
  let h = 0;
  for (const count of counts) if (count > 0) h -= (count / n) * Math.log2(count / n);
  return h;
}

/** Mutual information in bits. */
export function mutualInformation(observed: readonly (readonly number[])[]): number {
  const table = nonEmpty(observed);
  const rowTotals = table.map((row) => row.reduce((a, b) => a + b, 0));
  const columnTotals = table[0]?.map((_, j) => table.reduce((sum, row) => sum + row[j]!, 0)) ?? [];
  const n = rowTotals.reduce((a, b) => a + b, 0);
  let mi = 0;
  for (let i = 0; i < table.length; i++) {
    for (let j = 0; j < columnTotals.length; j++) {
      const count = table[i]![j]!;
      if (count > 0) mi += (count / n) * Math.log2((count * n) / (rowTotals[i]! * columnTotals[j]!));
    }
  }
  return Math.max(0, mi);
}

/** Mutual information over the mean of the two entropies, in [0, 1]; 0 when either side is constant. */
export function normalisedMutualInformation(observed: readonly (readonly number[])[]): number {
  const table = nonEmpty(observed);
  const rowTotals = table.map((row) => row.reduce((a, b) => a + b, 0));
  const columnTotals = table[0]?.map((_, j) => table.reduce((sum, row) => sum + row[j]!, 0)) ?? [];
  const n = rowTotals.reduce((a, b) => a + b, 0);
  const hRows = entropyBits(rowTotals, n);
  const hColumns = entropyBits(columnTotals, n);
  if (hRows === 0 || hColumns === 0) return 0;
  return Math.min(1, mutualInformation(table) / ((hRows + hColumns) / 2));
}

/** Cohen's conventions 0.1 / 0.3 / 0.5 (strictly for one degree of freedom; used as a rough guide). */
export function strengthBand(v: number): 'negligible' | 'small' | 'medium' | 'large' {
  if (v >= 0.5) return 'large';
  if (v >= 0.3) return 'medium';
  if (v >= 0.1) return 'small';
  return 'negligible';
}

export type ProxyRow = {
  feature: string;
  blockedField: string;
  cramersV: number;
  normalisedMutualInformation: number;
  chiSquare: number;
  dof: number;
  n: number;
  /** quantile bins used for the feature / the blocked field; null where the column is categorical */
  featureBins: number | null;
  blockedFieldBins: number | null;
  strength: ReturnType<typeof strengthBand>;
  flagged: boolean;
};

export type ProxyReportOptions = { bins?: number; kinds?: Record<string, ColumnKind> };

/**
 * Association of every allowed feature with every blocked field, strongest first, with the pairs
 * whose Cramér's V is at or above `threshold` flagged.
 */
export function proxyReport(
  columns: Record<string, readonly Cell[]>,
  allowedFeatures: readonly string[],
  blockedFields: readonly string[],
  threshold: number,
  options: ProxyReportOptions = {},
): ProxyRow[] {
  const levelCache = new Map<string, Levels>();
  const levelsOf = (name: string): Levels => {
    let levels = levelCache.get(name);
    if (!levels) {
      const values = columns[name];
      if (!values) throw new Error(`unknown column "${name}"`);
      levels = toLevels(values, { kind: options.kinds?.[name], bins: options.bins });
      levelCache.set(name, levels);
    }
    return levels;
  };
  const blocked = blockedFields.filter((name) => name in columns);
  const rows: ProxyRow[] = [];
  for (const feature of allowedFeatures) {
    if (!(feature in columns) || blockedFields.includes(feature)) continue;
    const featureLevels = levelsOf(feature);
    for (const blockedField of blocked) {
      const blockedLevels = levelsOf(blockedField);
      const table = contingencyTable(featureLevels, blockedLevels);
      const test = chiSquare(table);
      const v = cramersV(table);
      rows.push({
        feature,
        blockedField,
        cramersV: v,
        normalisedMutualInformation: normalisedMutualInformation(table),
        chiSquare: test.chiSquare,
        dof: test.dof,
        n: test.n,
        featureBins: featureLevels.kind === 'categorical' ? null : featureLevels.bins,
        blockedFieldBins: blockedLevels.kind === 'categorical' ? null : blockedLevels.bins,
        strength: strengthBand(v),
        flagged: v >= threshold,
      });
    }
  }
  return rows.sort(
    (a, b) =>
      b.cramersV - a.cramersV ||
      b.normalisedMutualInformation - a.normalisedMutualInformation ||
      a.feature.localeCompare(b.feature) ||
      a.blockedField.localeCompare(b.blockedField),
  );
}
