import type { TreeNode } from '../../../shared/tree.js';
import { describeSegments, featureImportance, type Importance, type Segment } from './explain.js';
import { allRows, type FitOptions, featureNames, growOptions, prepareTraining } from './fit.js';
import { effectiveMinLeaf, type GrownTree, type GrowOptions, growTree, rowWeights } from './grow.js';
import {
  type CalibrationBin,
  type ConfusionMatrix,
  calibrationByDecile,
  computeMetrics,
  confusionMatrix,
  type GainsBin,
  gainsByDecile,
  type Metrics,
  type RocPoint,
  rocCurve,
  type Spread,
  spread,
} from './metrics.js';
import { leafAtAlpha, type PruningSequence, pruningSequence } from './prune.js';
import { seededRandom, stratifiedFolds, stratifiedHoldout } from './split-rows.js';
import type { Table } from './table.js';
import { compileTree, leafIndicesOf, share, toTreeJson } from './tree-json.js';

export type Phase = 'cross-validating' | 'pruning' | 'fitting' | 'explaining';
export type Progress = { phase: Phase; progress: number };

export type TrainOptions = FitOptions & {
  /** 'cv': cost-complexity pruning with α chosen by cross-validation and the one-standard-error rule */
  pruning?: 'cv' | 'none';
  /** stratified folds for cross-validation (at least 2) */
  folds?: number;
  seed?: number;
  /** share of rows kept aside, stratified, for a holdout evaluation (0 = none) */
  holdout?: number;
  /** probability at or above which a row counts as a predicted leaver; default: the base rate */
  threshold?: number;
};

export type Evaluation = {
  metrics: Metrics;
  roc: RocPoint[];
  calibration: CalibrationBin[];
  gains: GainsBin[];
  confusion: ConfusionMatrix;
};

export type PruningStep = { alpha: number; leaves: number; cvError: number; cvStandardError: number };

export type ModelResult = {
  tree: TreeNode;
  settings: GrowOptions & {
    effectiveMinLeaf: number;
    minLeafRaisedToK: boolean;
    pruning: 'cv' | 'none';
    folds: number;
    seed: number;
    holdout: number;
    threshold: number;
    maxBins: number | null;
    features: string[];
  };
  rowCount: number;
  trainingRows: number;
  positive: number;
  baseRate: number;
  pruning: {
    alpha: number;
    rule: 'one-standard-error' | 'none';
    /** candidate α (geometric means of the path's α), with cross-validated Brier score */
    path: PruningStep[];
  };
  crossValidation: {
    folds: number;
    /** each metric's mean and standard deviation across folds */
    metrics: Record<keyof Metrics, Spread>;
    /** out-of-fold predictions pooled over the folds */
    pooled: Evaluation;
  } | null;
  holdout: Evaluation | null;
  importance: Importance[];
  segments: Segment[];
};

type FoldModel = { grown: GrownTree; sequence: PruningSequence; validation: Int32Array };

/**
 * Trains a classification tree end to end: cross-validation, pruning, the final fit and its
 * explanation. The result is plain JSON-serialisable data (NaN stands for "undefined here").
 */
export function trainModel(
  table: Table,
  label: ArrayLike<number>,
  options: TrainOptions = {},
  onProgress?: (progress: Progress) => void,
): ModelResult {
  const report = (phase: Phase, progress: number) => onProgress?.({ phase, progress: Math.min(1, progress) });
  const grow = growOptions(options);
  const seed = options.seed ?? 1;
  const folds = Math.max(2, Math.floor(options.folds ?? 5));
  const pruning = options.pruning ?? 'cv';
  const holdoutShare = options.holdout ?? 0;
  if (!(holdoutShare >= 0 && holdoutShare < 1)) throw new Error('holdout must be a share from 0 to below 1');

  report('fitting', 0);
  const data = prepareTraining(table, label, options);
  const y = data.label;
  const positives = y.reduce((a, b) => a + b, 0);
  if (positives === 0 || positives === y.length) {
    throw new Error('The outcome has only one class: a tree needs both leavers and stayers');
  }
  const random = seededRandom(seed);
  const { train, test } =
    holdoutShare > 0 ? stratifiedHoldout(y, holdoutShare, random) : { train: allRows(y.length), test: null };
  let trainPositives = 0;
  for (const r of train) trainPositives += y[r];
  const baseRate = trainPositives / train.length;
  const threshold = options.threshold ?? baseRate;

  const full = growTree(data, Int32Array.from(train), grow);
  const fullSequence = pruningSequence(full);
  report('fitting', 0.1);

  const canCrossValidate = Math.min(trainPositives, train.length - trainPositives) >= folds;
  const foldModels: FoldModel[] = [];
  if (canCrossValidate) {
    const assignment = stratifiedFolds(y, train, folds, random);
    for (let f = 0; f < folds; f++) {
      const fitRows = train.filter((_, i) => assignment[i] !== f);
      const validation = train.filter((_, i) => assignment[i] === f);
      const grown = growTree(data, Int32Array.from(fitRows), grow);
      foldModels.push({ grown, sequence: pruningSequence(grown), validation: Int32Array.from(validation) });
      report('cross-validating', 0.1 + (0.7 * (f + 1)) / folds);
    }
  }

  report('pruning', 0.8);
  const weights = rowWeights(data, Int32Array.from(train), grow.classWeight);
  const stats = foldStatistics(foldModels, table, y, weights);
  const path = candidateAlphas(fullSequence).map((alpha, j) => ({
    alpha,
    leaves: leavesAt(fullSequence, alpha),
    ...crossValidatedError(stats, alpha),
    j,
  }));
  let chosen = 0;
  let rule: 'one-standard-error' | 'none' = 'none';
  if (pruning === 'cv' && foldModels.length > 0) {
    rule = 'one-standard-error';
    // Breiman et al. (1984), §3.4.3: the simplest tree within one standard error of the best
    let best = path[0];
    for (const step of path) if (step.cvError < best.cvError) best = step;
    const limit = best.cvError + best.cvStandardError;
    for (const step of path) if (step.cvError <= limit) chosen = step.j;
  }
  const alpha = path[chosen]?.alpha ?? 0;

  report('fitting', 0.85);
  const isLeaf = leafAtAlpha(fullSequence, alpha);
  const tree = toTreeJson(full, isLeaf);

  let crossValidation: ModelResult['crossValidation'] = null;
  if (foldModels.length > 0) {
    const foldMetrics: Metrics[] = [];
    const pooledRows: number[] = [];
    const pooledScores: number[] = [];
    for (const fold of foldModels) {
      const scores = predictRows(
        toTreeJson(fold.grown, leafAtAlpha(fold.sequence, alpha)),
        table,
        fold.validation,
      );
      const labels = Array.from(fold.validation, (r) => y[r]);
      foldMetrics.push(computeMetrics(labels, scores, threshold));
      for (const r of fold.validation) pooledRows.push(r);
      for (const score of scores) pooledScores.push(score);
    }
    const keys = Object.keys(foldMetrics[0]) as (keyof Metrics)[];
    crossValidation = {
      folds,
      metrics: Object.fromEntries(keys.map((key) => [key, spread(foldMetrics.map((m) => m[key]))])) as Record<
        keyof Metrics,
        Spread
      >,
      pooled: evaluate(
        pooledRows.map((r) => y[r]),
        pooledScores,
        threshold,
      ),
    };
  }
  const holdout = test
    ? evaluate(
        Array.from(test, (r) => y[r]),
        predictRows(tree, table, test),
        threshold,
      )
    : null;

  report('explaining', 0.95);
  const importance = featureImportance(full, isLeaf);
  const segments = describeSegments(tree, table);
  const minLeaf = effectiveMinLeaf(grow);
  report('explaining', 1);
  return {
    tree,
    settings: {
      ...grow,
      effectiveMinLeaf: minLeaf,
      minLeafRaisedToK: minLeaf > grow.minLeaf,
      pruning,
      folds,
      seed,
      holdout: holdoutShare,
      threshold,
      maxBins: options.maxBins ?? null,
      features: featureNames(table, options),
    },
    rowCount: y.length,
    trainingRows: train.length,
    positive: trainPositives,
    baseRate,
    pruning: { alpha, rule, path: path.map(({ j: _j, ...step }) => step) },
    crossValidation,
    holdout,
    importance,
    segments,
  };
}

export function evaluate(labels: number[], scores: ArrayLike<number>, threshold: number): Evaluation {
  return {
    metrics: computeMetrics(labels, scores, threshold),
    roc: rocCurve(labels, scores),
    calibration: calibrationByDecile(labels, scores),
    gains: gainsByDecile(labels, scores),
    confusion: confusionMatrix(labels, scores, threshold),
  };
}

function predictRows(tree: TreeNode, table: Table, rows: Int32Array): number[] {
  const compiled = compileTree(tree, table);
  const leaves = leafIndicesOf(compiled, rows);
  return Array.from(leaves, (i) => share(compiled.nodes[i]));
}

/** Geometric means of consecutive distinct α on the path (the first is 0: the full tree). */
function candidateAlphas(sequence: PruningSequence): number[] {
  const distinct = [...new Set(sequence.alphas)].sort((a, b) => a - b);
  return distinct.map((a, i) => (i + 1 < distinct.length ? Math.sqrt(a * distinct[i + 1]) : a));
}

function leavesAt(sequence: PruningSequence, alpha: number): number {
  let leaves = sequence.leaves[0];
  for (let i = 1; i < sequence.alphas.length; i++)
    if (sequence.alphas[i] <= alpha) leaves = sequence.leaves[i];
  return leaves;
}

type FoldStats = {
  fold: FoldModel;
  /** per node of the fold's full tree: held-out weight, weighted leavers, and their squares */
  w: Float64Array;
  wp: Float64Array;
  w2: Float64Array;
  w2p: Float64Array;
};

/** Held-out rows summed per leaf of each fold's full tree, once for all candidate α. */
function foldStatistics(
  foldModels: FoldModel[],
  table: Table,
  y: Uint8Array,
  weights: Float64Array,
): FoldStats[] {
  return foldModels.map((fold) => {
    const count = fold.grown.nodes.length;
    const stats = {
      fold,
      w: new Float64Array(count),
      wp: new Float64Array(count),
      w2: new Float64Array(count),
      w2p: new Float64Array(count),
    };
    // the JSON tree lists nodes in the same pre-order as the grown tree
    const leaves = leafIndicesOf(compileTree(toTreeJson(fold.grown), table), fold.validation);
    for (let k = 0; k < fold.validation.length; k++) {
      const r = fold.validation[k];
      const leaf = leaves[k];
      const w = weights[r];
      stats.w[leaf] += w;
      stats.w2[leaf] += w * w;
      if (y[r] === 1) {
        stats.wp[leaf] += w;
        stats.w2p[leaf] += w * w;
      }
    }
    return stats;
  });
}

/**
 * Weighted Brier score of the fold trees pruned at α on their held-out rows, with the standard
 * error of that mean taken over rows (as rpart's xstd).
 */
function crossValidatedError(
  folds: FoldStats[],
  alpha: number,
): { cvError: number; cvStandardError: number } {
  if (folds.length === 0) return { cvError: Number.NaN, cvStandardError: Number.NaN };
  let loss = 0;
  let lossSquared = 0;
  let lossTimesWeight = 0;
  let weight = 0;
  let weightSquared = 0;
  for (const { fold, w, wp, w2, w2p } of folds) {
    const nodes = fold.grown.nodes;
    const isLeaf = leafAtAlpha(fold.sequence, alpha);
    for (let leaf = 0; leaf < nodes.length; leaf++) {
      if (w[leaf] === 0) continue;
      // a held-out row ends in the topmost node on its path that is a leaf at α
      let top = leaf;
      for (let a = leaf; a >= 0; a = nodes[a].parent) if (isLeaf(a)) top = a;
      const node = nodes[top];
      const p = node.weight > 0 ? node.weightedPositive / node.weight : 0;
      const q = 1 - p;
      const negatives = w[leaf] - wp[leaf];
      const negativesSquared = w2[leaf] - w2p[leaf];
      // leavers lose (1 − p)², stayers p², each times its weight
      loss += q * q * wp[leaf] + p * p * negatives;
      lossSquared += q ** 4 * w2p[leaf] + p ** 4 * negativesSquared;
      lossTimesWeight += q * q * w2p[leaf] + p * p * negativesSquared;
      weight += w[leaf];
      weightSquared += w2[leaf];
    }
  }
  const error = loss / weight;
  const variance = lossSquared - 2 * error * lossTimesWeight + error * error * weightSquared;
  return { cvError: error, cvStandardError: Math.sqrt(Math.max(0, variance)) / weight };
}
