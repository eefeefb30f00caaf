import type { Column, Table } from './table.js';

/**
 * Every feature becomes small integer bin codes so that split search works on per-node histograms
 * instead of sorting. Bin 0 holds missing values; bins 1..nBins hold values in ascending order
 * (numeric) or one level each (categorical). A numeric column with at most `maxBins` distinct
 * values gets one bin per value, so thresholds are exactly the midpoints a sort-based tree finds;
 * above that, bins are quantiles and a threshold may move to a nearby midpoint.
 */
export type BinnedFeature = {
  name: string;
  kind: 'numeric' | 'categorical';
  bins: Uint16Array;
  nBins: number;
  /** numeric: smallest and largest value in each bin (index = bin code) */
  binMin: Float64Array;
  binMax: Float64Array;
  /** categorical: level of bin b is levels[b - 1] */
  levels: string[];
  /** this feature's first slot in a histogram (nBins + 1 slots) */
  offset: number;
};

export const DEFAULT_MAX_BINS = 256;
export const MAX_BINS_LIMIT = 65535;

export function binFeatures(
  table: Table,
  featureNames: string[],
  maxBins = DEFAULT_MAX_BINS,
): BinnedFeature[] {
  const limit = Math.max(2, Math.min(MAX_BINS_LIMIT, Math.floor(maxBins)));
  let offset = 0;
  return featureNames.map((name) => {
    const column = table.columns.find((c) => c.name === name);
    if (!column) throw new Error(`Unknown feature column "${name}"`);
    const feature = binColumn(column, limit, offset);
    offset += feature.nBins + 1;
    return feature;
  });
}

function binColumn(column: Column, maxBins: number, offset: number): BinnedFeature {
  if (column.kind === 'categorical') {
    if (column.levels.length > MAX_BINS_LIMIT) throw new Error(`Column "${column.name}" has too many levels`);
    const bins = new Uint16Array(column.codes.length);
    for (let i = 0; i < bins.length; i++) bins[i] = column.codes[i] + 1;
    return {
      name: column.name,
      kind: 'categorical',
      bins,
      nBins: column.levels.length,
      binMin: new Float64Array(0),
      binMax: new Float64Array(0),
      levels: column.levels,
      offset,
    };
  }
  const values = column.values;
  const n = values.length;
  let present = 0;
  // exact bins when the column has at most maxBins distinct values (checked in one pass)
  let distinctSet: Set<number> | null = new Set<number>();
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    present++;
    if (distinctSet) {
      distinctSet.add(v);
      if (distinctSet.size > maxBins) distinctSet = null;
    }
  }
  let cuts: Float64Array;
  if (distinctSet) {
    const distinct = Float64Array.from(distinctSet).sort();
    cuts = new Float64Array(Math.max(0, distinct.length - 1));
    for (let b = 0; b < cuts.length; b++) cuts[b] = midpoint(distinct[b], distinct[b + 1]);
  } else {
    cuts = quantileCuts(values, present, maxBins);
  }
  const nBins = cuts.length + 1;
  const bins = new Uint16Array(n);
  const binMin = new Float64Array(nBins + 1).fill(Number.POSITIVE_INFINITY);
  const binMax = new Float64Array(nBins + 1).fill(Number.NEGATIVE_INFINITY);
  // a coarse grid over the cuts' range points each value near its bin; a short scan finishes
  const first = cuts.length > 0 ? cuts[0] : 0;
  const last = cuts.length > 0 ? cuts[cuts.length - 1] : 0;
  const cells = 4 * (cuts.length + 1);
  const scale = last > first ? cells / (last - first) : 0;
  const start = new Int32Array(cells + 1);
  for (let c = 0, b = 0; c <= cells; c++) {
    const lower = first + c / scale;
    while (b < cuts.length && cuts[b] < lower) b++;
    start[c] = Math.max(0, b - 1);
  }
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    // bin = index of the first cut with v <= cut, plus one
    let b = 0;
    if (v > first) {
      const c = scale > 0 ? Math.min(cells, Math.floor((v - first) * scale)) : 0;
      b = start[c];
      while (b < cuts.length && v > cuts[b]) b++;
      while (b > 0 && v <= cuts[b - 1]) b--;
    }
    b += 1;
    bins[i] = b;
    if (v < binMin[b]) binMin[b] = v;
    if (v > binMax[b]) binMax[b] = v;
  }
  return {
    name: column.name,
    kind: 'numeric',
    bins,
    nBins: present > 0 ? nBins : 0,
    binMin,
    binMax,
    levels: [],
    offset,
  };
}

const QUANTILE_SAMPLE = 25_000;

/**
 * Cut points between bins of about equal row counts, from a systematic sample of the present
 * values; each cut is a midpoint between two consecutive distinct sample values.
 */
function quantileCuts(values: Float64Array, present: number, maxBins: number): Float64Array {
  const step = Math.max(1, Math.floor(present / QUANTILE_SAMPLE));
  const sample = new Float64Array(Math.ceil(present / step));
  let size = 0;
  for (let i = 0, k = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    if (k % step === 0 && size < sample.length) sample[size++] = v;
    k++;
  }
  const sorted = sample.subarray(0, size).sort();
  const cuts: number[] = [];
  let next = size / maxBins;
  for (let i = 0; i < size - 1; i++) {
    if (i + 1 >= next && sorted[i + 1] !== sorted[i]) {
      cuts.push(midpoint(sorted[i], sorted[i + 1]));
      while (next <= i + 1) next += size / maxBins;
      if (cuts.length >= maxBins - 1) break;
    }
  }
  return Float64Array.from(cuts);
}

/** Midpoint of two consecutive values; if rounding lands on the upper value, use the lower one. */
export function midpoint(lower: number, upper: number): number {
  const mid = lower / 2 + upper / 2;
  return mid >= upper || !Number.isFinite(mid) ? lower : mid;
}
