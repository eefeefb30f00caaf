import { describe, expect, it } from 'vitest';
import {
  averagePrecision,
  brierScore,
  calibrationByDecile,
  computeMetrics,
  confusionMatrix,
  gainsByDecile,
  rocAuc,
  rocCurve,
  spread,
} from '../../../backend/src/modeling/metrics.js';

// Fawcett, "An introduction to ROC analysis" (2006), Fig. 3 (table from memory)
const fawcettClasses = 'p p n p p p n n p n p n p n n n p n p n'.split(' ').map((c) => (c === 'p' ? 1 : 0));
const fawcettScores = [
  0.9, 0.8, 0.7, 0.6, 0.55, 0.54, 0.53, 0.52, 0.51, 0.505, 0.4, 0.39, 0.38, 0.37, 0.36, 0.35, 0.34, 0.33, 0.3,
  0.1,
];

describe('evaluation metrics', () => {
  // scikit-learn's roc_auc_score docstring example
  it('gives the ROC AUC of the scikit-learn docstring example, 0.75', () => {
    expect(rocAuc([0, 0, 1, 1], [0.1, 0.4, 0.35, 0.8])).toBeCloseTo(0.75, 12);
  });

  it("gives the ROC AUC of Fawcett's Fig. 3 table, 0.68", () => {
    expect(rocAuc(fawcettClasses, fawcettScores)).toBeCloseTo(0.68, 12);
  });

  // Hanley & McNeil (1982): AUC = U / (n1 n0), a tie counting one half
  it('counts a tie between a leaver and a stayer as one half', () => {
    expect(rocAuc([0, 1], [0.5, 0.5])).toBe(0.5);
    expect(rocAuc([0, 1, 1], [0.2, 0.2, 0.9])).toBe(0.75);
  });

  it('draws the ROC curve from (0,0) to (1,1) through each distinct score', () => {
    const curve = rocCurve([0, 0, 1, 1], [0.1, 0.4, 0.35, 0.8]);
    expect(curve.map((p) => [p.falsePositiveRate, p.truePositiveRate])).toEqual([
      [0, 0],
      [0, 0.5],
      [0.5, 0.5],
      [0.5, 1],
      [1, 1],
    ]);
  });

  // scikit-learn's average_precision_score docstring example: 0.83
  it('gives the average precision of the scikit-learn docstring example', () => {
    expect(averagePrecision([0, 0, 1, 1], [0.1, 0.4, 0.35, 0.8])).toBeCloseTo(0.8333333, 6);
  });

  it('counts the confusion matrix, precision, recall and F1 at a threshold', () => {
    const m = confusionMatrix(fawcettClasses, fawcettScores, 0.5);
    expect(m).toMatchObject({ truePositive: 6, falsePositive: 4, trueNegative: 6, falseNegative: 4 });
    const metrics = computeMetrics(fawcettClasses, fawcettScores, 0.5);
    expect(metrics.precision).toBeCloseTo(0.6, 12);
    expect(metrics.recall).toBeCloseTo(0.6, 12);
    expect(metrics.f1).toBeCloseTo(0.6, 12);
    expect(metrics.accuracy).toBeCloseTo(0.6, 12);
    expect(metrics.baseRate).toBe(0.5);
  });

  it('gives the Brier score as the mean squared difference', () => {
    // scikit-learn's brier_score_loss docstring example: 0.0375
    expect(brierScore([0, 1, 1, 0], [0.1, 0.9, 0.8, 0.3])).toBeCloseTo(0.0375, 12);
  });

  it('groups calibration and gains into ten deciles that end at all the leavers', () => {
    const labels = Array.from({ length: 100 }, (_, i) => (i % 3 === 0 ? 1 : 0));
    const scores = labels.map((y, i) => (y ? 0.5 + i / 1000 : i / 1000));
    const calibration = calibrationByDecile(labels, scores);
    expect(calibration).toHaveLength(10);
    expect(calibration.reduce((a, b) => a + b.n, 0)).toBe(100);
    const gains = gainsByDecile(labels, scores);
    expect(gains[9].positiveShare).toBe(1);
    expect(gains[9].lift).toBeCloseTo(1, 12);
    // the top 30% hold 30 of the 34 leavers
    expect(gains[2].positiveShare).toBeCloseTo(30 / 34, 12);
  });

  it('summarises fold values by mean and sample standard deviation', () => {
    const s = spread([1, 2, 3, 4]);
    expect(s.mean).toBe(2.5);
    expect(s.sd).toBeCloseTo(Math.sqrt(5 / 3), 12);
  });
});
