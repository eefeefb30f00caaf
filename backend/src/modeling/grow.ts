import type { Split } from '../../../shared/tree.js';
import { type BinnedFeature, midpoint } from './binning.js';
import type { Criterion } from './impurity.js';

export type ClassWeight = 'none' | 'balanced';

export type GrowOptions = {
  criterion: Criterion;
  maxDepth: number;
  minLeaf: number;
  minSplit: number;
  minImpurityDecrease: number;
  classWeight: ClassWeight;
  /** the privacy policy's minimum group size: no leaf is smaller than max(minLeaf, k) */
  k: number;
  /**
   * a categorical level with fewer rows at a node is not split off from the levels never seen
   * there (default: 1 per 200 training rows, from 1 to 100)
   */
  minCategoryRows?: number;
};

/** One row per 200, 1 to 100, after LightGBM's min_data_per_group of 100 (common practice). */
export function defaultMinCategoryRows(trainingRows: number): number {
  return Math.min(100, Math.max(1, Math.floor(trainingRows / 200)));
}

/** Training data after binning: features, a 0/1 label and optional row weights, indexed by row. */
export type TrainingData = {
  features: BinnedFeature[];
  label: Uint8Array;
  rowWeight: Float64Array | null;
  totalSlots: number;
};

/** One node of a grown tree, in depth-first pre-order with the left child first. */
export type GrownNode = {
  n: number;
  positive: number;
  weight: number;
  weightedPositive: number;
  impurity: number;
  depth: number;
  parent: number;
  left: number;
  right: number;
  /** index into the features, -1 for a leaf */
  feature: number;
  /** numeric: bins 1..binThreshold go left */
  binThreshold: number;
  /** categorical: leftBins[bin] === 1 goes left */
  leftBins: Uint8Array | null;
  missingGoesLeft: boolean;
  split: Split | null;
  /** weighted impurity decrease of the split as a share of the root's weight */
  improvement: number;
};

export type GrownTree = {
  nodes: GrownNode[];
  features: BinnedFeature[];
  criterion: Criterion;
  totalWeight: number;
};

const EPSILON = 2.220446049250313e-16;

function cost(isGini: boolean, w: number, wp: number): number {
  if (w <= 0) return 0;
  if (isGini) return (2 * wp * (w - wp)) / w;
  const p = wp / w;
  if (p <= 0 || p >= 1) return 0;
  return -w * (p * Math.log2(p) + (1 - p) * Math.log2(1 - p));
}

export function effectiveMinLeaf(options: Pick<GrowOptions, 'minLeaf' | 'k'>): number {
  return Math.max(1, Math.floor(options.minLeaf), Math.floor(options.k));
}

/** Per-row training weights: class weights ('balanced' = n / (2 · n_class)) times row weights. */
export function rowWeights(data: TrainingData, rows: Int32Array, classWeight: ClassWeight): Float64Array {
  const size = data.label.length;
  const w = new Float64Array(size);
  let positives = 0;
  for (let i = 0; i < rows.length; i++) positives += data.label[rows[i]];
  const negatives = rows.length - positives;
  const w1 = classWeight === 'balanced' && positives > 0 ? rows.length / (2 * positives) : 1;
  const w0 = classWeight === 'balanced' && negatives > 0 ? rows.length / (2 * negatives) : 1;
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i];
    w[r] = (data.label[r] === 1 ? w1 : w0) * (data.rowWeight ? data.rowWeight[r] : 1);
  }
  return w;
}

type Pending = {
  start: number;
  end: number;
  depth: number;
  parent: number;
  isLeft: boolean;
  positive: number;
  weight: number;
  weightedPositive: number;
  hist: Float64Array | null;
};

type Best = {
  cost: number;
  feature: number;
  binThreshold: number;
  leftBins: Uint8Array | null;
  missingGoesLeft: boolean;
  split: Split | null;
};

/**
 * Grows a CART tree on the given rows (histogram split search, the smaller child's histogram
 * subtracted from the parent's for the larger one). `rows` is reordered in place.
 */
export function growTree(data: TrainingData, rows: Int32Array, options: GrowOptions): GrownTree {
  const { features, label } = data;
  const isGini = options.criterion === 'gini';
  const minLeaf = effectiveMinLeaf(options);
  const minSplit = Math.max(2, Math.floor(options.minSplit), 2 * minLeaf);
  const maxDepth = Math.max(0, Math.floor(options.maxDepth));
  const minCategoryRows = options.minCategoryRows ?? defaultMinCategoryRows(rows.length);
  const w = rowWeights(data, rows, options.classWeight);
  const scratch = new Int32Array(rows.length);
  const orderScratch = new Int32Array(features.reduce((m, f) => Math.max(m, f.nBins), 0) + 1);
  const nodes: GrownNode[] = [];

  let rootPositive = 0;
  let rootWeight = 0;
  let rootWeightedPositive = 0;
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i];
    rootPositive += label[r];
    rootWeight += w[r];
    if (label[r] === 1) rootWeightedPositive += w[r];
  }
  const totalWeight = rootWeight;

  const splittable = (n: number, positive: number, depth: number) =>
    depth < maxDepth && n >= minSplit && positive > 0 && positive < n;

  // with every weight 1 the weight column equals the count, so it is filled in afterwards
  let unweighted = true;
  for (let i = 0; i < rows.length && unweighted; i++) if (w[rows[i]] !== 1) unweighted = false;
  const weightedLabel = new Float64Array(w.length);
  for (let i = 0; i < rows.length; i++) weightedLabel[rows[i]] = w[rows[i]] * label[rows[i]];
  const pool: Float64Array[] = [];
  const release = (h: Float64Array | null) => {
    if (h) pool.push(h);
  };
  const buildHistogram = (start: number, end: number): Float64Array => {
    const h = pool.pop()?.fill(0) ?? new Float64Array(3 * data.totalSlots);
    for (let f = 0; f < features.length; f++) {
      const bins = features[f].bins;
      const base = 3 * features[f].offset;
      if (unweighted) {
        for (let i = start; i < end; i++) {
          const r = rows[i];
          const j = base + 3 * bins[r];
          h[j] += 1;
          h[j + 2] += label[r];
        }
      } else {
        for (let i = start; i < end; i++) {
          const r = rows[i];
          const j = base + 3 * bins[r];
          h[j] += 1;
          h[j + 1] += w[r];
          h[j + 2] += weightedLabel[r];
        }
      }
    }
    if (unweighted) for (let j = 0; j < h.length; j += 3) h[j + 1] = h[j];
    return h;
  };

  const stack: Pending[] = [
    {
      start: 0,
      end: rows.length,
      depth: 0,
      parent: -1,
      isLeft: true,
      positive: rootPositive,
      weight: rootWeight,
      weightedPositive: rootWeightedPositive,
      hist: splittable(rows.length, rootPositive, 0) ? buildHistogram(0, rows.length) : null,
    },
  ];

  while (stack.length > 0) {
    const item = stack.pop()!;
    const n = item.end - item.start;
    const nodeCost = cost(isGini, item.weight, item.weightedPositive);
    const node: GrownNode = {
      n,
      positive: item.positive,
      weight: item.weight,
      weightedPositive: item.weightedPositive,
      impurity: item.weight > 0 ? nodeCost / item.weight : 0,
      depth: item.depth,
      parent: item.parent,
      left: -1,
      right: -1,
      feature: -1,
      binThreshold: 0,
      leftBins: null,
      missingGoesLeft: false,
      split: null,
      improvement: 0,
    };
    const id = nodes.length;
    nodes.push(node);
    if (item.parent >= 0) {
      if (item.isLeft) nodes[item.parent].left = id;
      else nodes[item.parent].right = id;
    }
    const hist = item.hist;
    if (!hist) continue;
    if (node.impurity <= EPSILON) {
      release(hist);
      continue;
    }

    const best = findBestSplit(
      hist,
      features,
      isGini,
      n,
      item.weight,
      item.weightedPositive,
      minLeaf,
      minCategoryRows,
      orderScratch,
    );
    const improvement = best ? (nodeCost - best.cost) / totalWeight : 0;
    if (!best || improvement + EPSILON < options.minImpurityDecrease) {
      release(hist);
      continue;
    }

    // partition rows: left ones stay in front (stable), right ones go through the scratch buffer
    const f = features[best.feature];
    const bins = f.bins;
    const numeric = f.kind === 'numeric';
    const tb = best.binThreshold;
    const leftBins = best.leftBins;
    const missLeft = best.missingGoesLeft;
    let l = item.start;
    let s = 0;
    let leftPositive = 0;
    let leftWeight = 0;
    let leftWeightedPositive = 0;
    for (let i = item.start; i < item.end; i++) {
      const r = rows[i];
      const b = bins[r];
      const goLeft = b === 0 ? missLeft : numeric ? b <= tb : leftBins![b] === 1;
      if (goLeft) {
        rows[l++] = r;
        leftPositive += label[r];
        leftWeight += w[r];
        if (label[r] === 1) leftWeightedPositive += w[r];
      } else scratch[s++] = r;
    }
    rows.set(scratch.subarray(0, s), l);

    node.feature = best.feature;
    node.binThreshold = tb;
    node.leftBins = leftBins;
    node.missingGoesLeft = missLeft;
    node.split = best.split;
    node.improvement = improvement;

    const nLeft = l - item.start;
    const nRight = item.end - l;
    const rightPositive = item.positive - leftPositive;
    const rightWeight = Math.max(0, item.weight - leftWeight);
    const rightWeightedPositive = Math.max(0, item.weightedPositive - leftWeightedPositive);
    const depth = item.depth + 1;
    const leftNeeds = splittable(nLeft, leftPositive, depth);
    const rightNeeds = splittable(nRight, rightPositive, depth);
    let leftHist: Float64Array | null = null;
    let rightHist: Float64Array | null = null;
    if (leftNeeds || rightNeeds) {
      const leftSmaller = nLeft <= nRight;
      const small = leftSmaller ? buildHistogram(item.start, l) : buildHistogram(l, item.end);
      for (let j = 0; j < hist.length; j++) hist[j] -= small[j];
      leftHist = leftSmaller ? small : hist;
      rightHist = leftSmaller ? hist : small;
      if (!leftNeeds) release(leftHist);
      if (!rightNeeds) release(rightHist);
    } else release(hist);
    stack.push({
      start: l,
      end: item.end,
      depth,
      parent: id,
      isLeft: false,
      positive: rightPositive,
      weight: rightWeight,
      weightedPositive: rightWeightedPositive,
      hist: rightNeeds ? rightHist : null,
    });
    stack.push({
      start: item.start,
      end: l,
      depth,
      parent: id,
      isLeft: true,
      positive: leftPositive,
      weight: leftWeight,
      weightedPositive: leftWeightedPositive,
      hist: leftNeeds ? leftHist : null,
    });
  }
  return { nodes, features, criterion: options.criterion, totalWeight };
}

function findBestSplit(
  h: Float64Array,
  features: BinnedFeature[],
  isGini: boolean,
  n: number,
  weight: number,
  weightedPositive: number,
  minLeaf: number,
  minCategoryRows: number,
  scratch: Int32Array,
): Best | null {
  // the best so far as plain numbers; the split object is built once at the end
  let bestFeature = -1;
  let bestOrder: Int32Array | null = null;
  let bestPosition = -1;
  let bestMissingLeft = false;
  let bestCost = Number.POSITIVE_INFINITY;
  // a later candidate must beat the best by more than rounding error, so ties keep the first
  let limit = Number.POSITIVE_INFINITY;
  for (let f = 0; f < features.length; f++) {
    const feature = features[f];
    const base = 3 * feature.offset;
    const mc = h[base];
    const mw = h[base + 1];
    const mp = h[base + 2];
    const presentCount = n - mc;
    if (presentCount < 1) continue;
    const presentWeight = weight - mw;
    const presentPositive = weightedPositive - mp;

    // bins with rows at this node, in split order
    let order: Int32Array;
    let size = 0;
    if (feature.kind === 'numeric') {
      order = scratch;
      for (let b = 1; b <= feature.nBins; b++) if (h[base + 3 * b] > 0) order[size++] = b;
    } else {
      // rare levels at this node stay on the right with levels never seen: ordering many small
      // levels by their share mostly fits noise
      const least = Math.max(1, minCategoryRows);
      const levels: number[] = [];
      for (let b = 1; b <= feature.nBins; b++) if (h[base + 3 * b] >= least) levels.push(b);
      // ordering levels by their (weighted) share of leavers gives the optimal binary split
      // for a two-class outcome: Breiman et al. (1984); Hastie et al., ESL 2nd ed. §9.2.4
      const share = (b: number) => {
        const bw = h[base + 3 * b + 1];
        return bw > 0 ? h[base + 3 * b + 2] / bw : 0;
      };
      levels.sort((x, y) => share(x) - share(y) || x - y);
      order = Int32Array.from(levels);
      size = order.length;
    }
    if (size < 2) continue;

    let lc = 0;
    let lw = 0;
    let lp = 0;
    for (let i = 0; i < size - 1; i++) {
      const j = base + 3 * order[i];
      lc += h[j];
      lw += h[j + 1];
      lp += h[j + 2];
      const rc = presentCount - lc;
      // the right side only shrinks from here on
      if (rc + mc < minLeaf) break;
      if (lc + mc < minLeaf) continue;
      const rw = presentWeight - lw;
      const rp = presentPositive - lp;
      if (mc > 0) {
        // missing rows to the left, then to the right
        const c1 =
          rc >= minLeaf ? cost(isGini, lw + mw, lp + mp) + cost(isGini, rw, rp) : Number.POSITIVE_INFINITY;
        if (c1 < limit) {
          limit = c1 - 1e-12 * c1;
          bestCost = c1;
          bestFeature = f;
          bestOrder = order;
          bestPosition = i;
          bestMissingLeft = true;
        }
        if (lc >= minLeaf) {
          const c2 = cost(isGini, lw, lp) + cost(isGini, rw + mw, rp + mp);
          if (c2 < limit) {
            limit = c2 - 1e-12 * c2;
            bestCost = c2;
            bestFeature = f;
            bestOrder = order;
            bestPosition = i;
            bestMissingLeft = false;
          }
        }
      } else if (rc >= minLeaf) {
        const c = cost(isGini, lw, lp) + cost(isGini, rw, rp);
        if (c < limit) {
          limit = c - 1e-12 * c;
          bestCost = c;
          bestFeature = f;
          bestOrder = order;
          bestPosition = i;
          // no missing rows here: later missing values follow the larger side
          bestMissingLeft = lc >= rc;
        }
      }
    }
    // numeric orders live in the shared scratch buffer: keep the two bins around the best cut
    if (bestFeature === f && bestOrder === scratch) {
      bestOrder = Int32Array.of(scratch[bestPosition], scratch[bestPosition + 1]);
      bestPosition = 0;
    }
  }
  if (bestFeature < 0 || !bestOrder) return null;
  return candidate(features[bestFeature], bestFeature, bestOrder, bestPosition, bestMissingLeft, bestCost);
}

function candidate(
  feature: BinnedFeature,
  f: number,
  order: Int32Array,
  position: number,
  missingGoesLeft: boolean,
  c: number,
): Best {
  if (feature.kind === 'numeric') {
    const lower = feature.binMax[order[position]];
    const upper = feature.binMin[order[position + 1]];
    return {
      cost: c,
      feature: f,
      binThreshold: order[position],
      leftBins: null,
      missingGoesLeft,
      split: { feature: feature.name, kind: 'numeric', threshold: midpoint(lower, upper), missingGoesLeft },
    };
  }
  const leftBins = new Uint8Array(feature.nBins + 1);
  for (let i = 0; i <= position; i++) leftBins[order[i]] = 1;
  const categories: string[] = [];
  for (let b = 1; b <= feature.nBins; b++) if (leftBins[b] === 1) categories.push(feature.levels[b - 1]);
  return {
    cost: c,
    feature: f,
    binThreshold: 0,
    leftBins,
    missingGoesLeft,
    split: { feature: feature.name, kind: 'categorical', categories, missingGoesLeft },
  };
}
