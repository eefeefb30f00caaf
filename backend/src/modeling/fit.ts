import type { TreeNode } from '../../../shared/tree.js';
import { binFeatures, DEFAULT_MAX_BINS } from './binning.js';
import { type GrownTree, type GrowOptions, growTree, type TrainingData } from './grow.js';
import type { Table } from './table.js';
import { toTreeJson } from './tree-json.js';

export type FitOptions = Partial<GrowOptions> & {
  /** allowed feature columns; blocked fields are simply never listed. Default: every column. */
  features?: string[];
  /** histogram bins per numeric column (exact below this many distinct values) */
  maxBins?: number;
  /** optional weight per row */
  rowWeight?: ArrayLike<number>;
};

export const DEFAULT_GROW_OPTIONS: GrowOptions = {
  criterion: 'gini',
  maxDepth: 6,
  minLeaf: 25,
  minSplit: 2,
  minImpurityDecrease: 0,
  classWeight: 'none',
  k: 5,
};

export function growOptions(options: FitOptions): GrowOptions {
  return {
    criterion: options.criterion ?? DEFAULT_GROW_OPTIONS.criterion,
    maxDepth: options.maxDepth ?? DEFAULT_GROW_OPTIONS.maxDepth,
    minLeaf: options.minLeaf ?? DEFAULT_GROW_OPTIONS.minLeaf,
    minSplit: options.minSplit ?? DEFAULT_GROW_OPTIONS.minSplit,
    minImpurityDecrease: options.minImpurityDecrease ?? DEFAULT_GROW_OPTIONS.minImpurityDecrease,
    classWeight: options.classWeight ?? DEFAULT_GROW_OPTIONS.classWeight,
    k: options.k ?? DEFAULT_GROW_OPTIONS.k,
    ...(options.minCategoryRows !== undefined ? { minCategoryRows: options.minCategoryRows } : {}),
  };
}

export function featureNames(table: Table, options: Pick<FitOptions, 'features'>): string[] {
  if (!options.features) return table.columns.map((c) => c.name);
  const known = new Set(table.columns.map((c) => c.name));
  const unknown = options.features.filter((f) => !known.has(f));
  if (unknown.length > 0) throw new Error(`Unknown feature columns: ${unknown.join(', ')}`);
  return [...new Set(options.features)];
}

/** Bins the allowed columns once; folds and the final fit all reuse it. */
export function prepareTraining(
  table: Table,
  label: ArrayLike<number>,
  options: FitOptions = {},
): TrainingData {
  if (label.length !== table.rowCount) {
    throw new Error(`The label has ${label.length} values, the table ${table.rowCount} rows`);
  }
  const y = new Uint8Array(table.rowCount);
  for (let i = 0; i < y.length; i++) y[i] = label[i] ? 1 : 0;
  const features = binFeatures(table, featureNames(table, options), options.maxBins ?? DEFAULT_MAX_BINS);
  let rowWeight: Float64Array | null = null;
  if (options.rowWeight) {
    if (options.rowWeight.length !== table.rowCount) throw new Error('One weight per row is needed');
    rowWeight = Float64Array.from(options.rowWeight);
    if (rowWeight.some((v) => !(v >= 0))) throw new Error('Row weights must be non-negative numbers');
  }
  const last = features[features.length - 1];
  return { features, label: y, rowWeight, totalSlots: last ? last.offset + last.nBins + 1 : 0 };
}

export function allRows(count: number): Int32Array {
  const rows = new Int32Array(count);
  for (let i = 0; i < count; i++) rows[i] = i;
  return rows;
}

/** Fits one unpruned tree on the whole table (or on `rows`). */
export function fitTree(
  table: Table,
  label: ArrayLike<number>,
  options: FitOptions = {},
  rows?: ArrayLike<number>,
): { tree: TreeNode; grown: GrownTree } {
  const data = prepareTraining(table, label, options);
  const grown = growTree(data, rows ? Int32Array.from(rows) : allRows(table.rowCount), growOptions(options));
  return { tree: toTreeJson(grown), grown };
}
