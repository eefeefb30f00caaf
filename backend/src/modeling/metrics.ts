/** Evaluation of predicted probabilities against 0/1 labels. */

export type RocPoint = { threshold: number; falsePositiveRate: number; truePositiveRate: number };
export type ConfusionMatrix = {
  threshold: number;
  truePositive: number;
  falsePositive: number;
  trueNegative: number;
  falseNegative: number;
};
export type CalibrationBin = { decile: number; n: number; meanPredicted: number; observedRate: number };
export type GainsBin = {
  decile: number;
  /** share of all rows in the top deciles so far */
  populationShare: number;
  /** share of all leavers found in the top deciles so far (cumulative gain) */
  positiveShare: number;
  /** leaver rate of the top deciles so far divided by the base rate */
  lift: number;
};

export type Metrics = {
  auc: number;
  averagePrecision: number;
  accuracy: number;
  precision: number;
  recall: number;
  f1: number;
  brier: number;
  baseRate: number;
};

function check(labels: ArrayLike<number>, scores: ArrayLike<number>) {
  if (labels.length !== scores.length) throw new Error('One score per label is needed');
}

/** Indices sorted by score, descending (stable). */
function byScoreDescending(scores: ArrayLike<number>): Int32Array {
  const idx = Int32Array.from({ length: scores.length }, (_, i) => i);
  return idx.sort((a, b) => scores[b] - scores[a] || a - b);
}

/**
 * ROC AUC as the Mann–Whitney U statistic over n₁·n₀, ties given half credit through average
 * ranks (Hanley & McNeil, Radiology 143:29–36, 1982). NaN when one class is absent.
 */
export function rocAuc(labels: ArrayLike<number>, scores: ArrayLike<number>): number {
  check(labels, scores);
  const n = labels.length;
  const idx = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => scores[a] - scores[b]);
  let rankSumPositive = 0;
  let positives = 0;
  let i = 0;
  while (i < n) {
    let j = i;
    while (j + 1 < n && scores[idx[j + 1]] === scores[idx[i]]) j++;
    const averageRank = (i + j + 2) / 2;
    for (let t = i; t <= j; t++) {
      if (labels[idx[t]] === 1) {
        rankSumPositive += averageRank;
        positives++;
      }
    }
    i = j + 1;
  }
  const negatives = n - positives;
  if (positives === 0 || negatives === 0) return Number.NaN;
  return (rankSumPositive - (positives * (positives + 1)) / 2) / (positives * negatives);
}

/** ROC points at each distinct score, from (0, 0) to (1, 1). */
export function rocCurve(labels: ArrayLike<number>, scores: ArrayLike<number>): RocPoint[] {
  check(labels, scores);
  const idx = byScoreDescending(scores);
  let positives = 0;
  for (let i = 0; i < labels.length; i++) positives += labels[i] === 1 ? 1 : 0;
  const negatives = labels.length - positives;
  const points: RocPoint[] = [
    { threshold: Number.POSITIVE_INFINITY, falsePositiveRate: 0, truePositiveRate: 0 },
  ];
  let tp = 0;
  let fp = 0;
  for (let i = 0; i < idx.length; i++) {
    if (labels[idx[i]] === 1) tp++;
    else fp++;
    if (i === idx.length - 1 || scores[idx[i + 1]] !== scores[idx[i]]) {
      points.push({
        threshold: scores[idx[i]],
        falsePositiveRate: negatives > 0 ? fp / negatives : 0,
        truePositiveRate: positives > 0 ? tp / positives : 0,
      });
    }
  }
  return points;
}

/** Average precision: Σ (Rₙ − Rₙ₋₁) Pₙ over distinct thresholds (scikit-learn's definition). */
export function averagePrecision(labels: ArrayLike<number>, scores: ArrayLike<number>): number {
  check(labels, scores);
  const idx = byScoreDescending(scores);
  let positives = 0;
  for (let i = 0; i < labels.length; i++) positives += labels[i] === 1 ? 1 : 0;
  if (positives === 0) return Number.NaN;
  let tp = 0;
  let previousRecall = 0;
  let ap = 0;
  for (let i = 0; i < idx.length; i++) {
    if (labels[idx[i]] === 1) tp++;
    if (i === idx.length - 1 || scores[idx[i + 1]] !== scores[idx[i]]) {
      const recall = tp / positives;
      ap += (recall - previousRecall) * (tp / (i + 1));
      previousRecall = recall;
    }
  }
  return ap;
}

/** Rows with a score at or above the threshold are predicted to leave. */
export function confusionMatrix(
  labels: ArrayLike<number>,
  scores: ArrayLike<number>,
  threshold: number,
): ConfusionMatrix {
  check(labels, scores);
  const m = { threshold, truePositive: 0, falsePositive: 0, trueNegative: 0, falseNegative: 0 };
  for (let i = 0; i < labels.length; i++) {
    const predicted = scores[i] >= threshold;
    if (labels[i] === 1) predicted ? m.truePositive++ : m.falseNegative++;
    else predicted ? m.falsePositive++ : m.trueNegative++;
  }
  return m;
}

export function brierScore(labels: ArrayLike<number>, scores: ArrayLike<number>): number {
  check(labels, scores);
  let sum = 0;
  for (let i = 0; i < labels.length; i++) sum += (scores[i] - labels[i]) ** 2;
  return labels.length > 0 ? sum / labels.length : Number.NaN;
}

/** Ten groups of (nearly) equal size by predicted probability, lowest first. */
export function calibrationByDecile(labels: ArrayLike<number>, scores: ArrayLike<number>): CalibrationBin[] {
  check(labels, scores);
  const idx = byScoreDescending(scores).reverse();
  const bins: CalibrationBin[] = [];
  for (let d = 0; d < 10; d++) {
    const from = Math.floor((d * idx.length) / 10);
    const to = Math.floor(((d + 1) * idx.length) / 10);
    let predicted = 0;
    let observed = 0;
    for (let i = from; i < to; i++) {
      predicted += scores[idx[i]];
      observed += labels[idx[i]];
    }
    const n = to - from;
    bins.push({
      decile: d + 1,
      n,
      meanPredicted: n > 0 ? predicted / n : Number.NaN,
      observedRate: n > 0 ? observed / n : Number.NaN,
    });
  }
  return bins;
}

/** Cumulative gains and lift by decile, highest predicted risk first. */
export function gainsByDecile(labels: ArrayLike<number>, scores: ArrayLike<number>): GainsBin[] {
  check(labels, scores);
  const idx = byScoreDescending(scores);
  let positives = 0;
  for (let i = 0; i < labels.length; i++) positives += labels[i];
  const baseRate = labels.length > 0 ? positives / labels.length : Number.NaN;
  const bins: GainsBin[] = [];
  let found = 0;
  let i = 0;
  for (let d = 0; d < 10; d++) {
    const to = Math.floor(((d + 1) * idx.length) / 10);
    for (; i < to; i++) found += labels[idx[i]];
    bins.push({
      decile: d + 1,
      populationShare: labels.length > 0 ? to / labels.length : Number.NaN,
      positiveShare: positives > 0 ? found / positives : Number.NaN,
      lift: to > 0 && baseRate > 0 ? found / to / baseRate : Number.NaN,
    });
  }
  return bins;
}

export function computeMetrics(
  labels: ArrayLike<number>,
  scores: ArrayLike<number>,
  threshold: number,
): Metrics {
  const m = confusionMatrix(labels, scores, threshold);
  const n = labels.length;
  const precision =
    m.truePositive + m.falsePositive > 0 ? m.truePositive / (m.truePositive + m.falsePositive) : 0;
  const recall =
    m.truePositive + m.falseNegative > 0 ? m.truePositive / (m.truePositive + m.falseNegative) : 0;
  return {
    auc: rocAuc(labels, scores),
    averagePrecision: averagePrecision(labels, scores),
    accuracy: n > 0 ? (m.truePositive + m.trueNegative) / n : Number.NaN,
    precision,
    recall,
    f1: precision + recall > 0 ? (2 * precision * recall) / (precision + recall) : 0,
    brier: brierScore(labels, scores),
    baseRate: n > 0 ? (m.truePositive + m.falseNegative) / n : Number.NaN,
  };
}

export type Spread = { mean: number; sd: number; values: number[] };

/** Mean and sample standard deviation across folds. */
export function spread(values: number[]): Spread {
  const finite = values.filter((v) => Number.isFinite(v));
  const mean = finite.length > 0 ? finite.reduce((a, b) => a + b, 0) / finite.length : Number.NaN;
  const sd =
    finite.length > 1
      ? Math.sqrt(finite.reduce((a, v) => a + (v - mean) ** 2, 0) / (finite.length - 1))
      : Number.NaN;
  return { mean, sd, values };
}
