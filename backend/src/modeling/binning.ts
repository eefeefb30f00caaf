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
  let present = 0;
  for (let i = 0; i < values.length; i++) if (!Number.isNaN(values[i])) present++;
  const sorted = new Float64Array(present);
  for (let i = 0, j = 0; i < values.length; i++) if (!Number.isNaN(values[i])) sorted[j++] = values[i];
  sorted.sort();

  // distinct values and their counts
  const distinct: number[] = [];
  const counts: number[] = [];
  for (let i = 0; i < sorted.length; i++) {
    if (i === 0 || sorted[i] !== sorted[i - 1]) {
      distinct.push(sorted[i]);
      counts.push(1);
    } else counts[counts.length - 1]++;
  }

  // groups of consecutive distinct values, each group one bin: [firstIndex, lastIndex]
  const groupEnds: number[] = [];
  if (distinct.length <= maxBins) {
    for (let i = 0; i < distinct.length; i++) groupEnds.push(i);
  } else {
    let cumulative = 0;
    let next = present / maxBins;
    for (let i = 0; i < distinct.length; i++) {
      cumulative += counts[i];
      if (cumulative >= next || i === distinct.length - 1) {
        groupEnds.push(i);
        while (next <= cumulative) next += present / maxBins;
      }
    }
  }
  const nBins = groupEnds.length;
  const binMin = new Float64Array(nBins + 1).fill(Number.NaN);
  const binMax = new Float64Array(nBins + 1).fill(Number.NaN);
  const cuts = new Float64Array(Math.max(0, nBins - 1));
  let start = 0;
  for (let b = 0; b < nBins; b++) {
    binMin[b + 1] = distinct[start];
    binMax[b + 1] = distinct[groupEnds[b]];
    start = groupEnds[b] + 1;
  }
  for (let b = 1; b < nBins; b++) cuts[b - 1] = midpoint(binMax[b], binMin[b + 1]);

  const bins = new Uint16Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v)) continue;
    // first cut with v <= cut; bin = its index + 1
    let lo = 0;
    let hi = cuts.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (v <= cuts[mid]) hi = mid;
      else lo = mid + 1;
    }
    bins[i] = lo + 1;
  }
  return { name: column.name, kind: 'numeric', bins, nBins, binMin, binMax, levels: [], offset };
}

/** Midpoint of two consecutive values; if rounding lands on the upper value, use the lower one. */
export function midpoint(lower: number, upper: number): number {
  const mid = lower / 2 + upper / 2;
  return mid >= upper || !Number.isFinite(mid) ? lower : mid;
}
