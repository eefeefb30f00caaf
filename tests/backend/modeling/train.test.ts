import { describe, expect, it } from 'vitest';
import { fitTree } from '../../../backend/src/modeling/fit.js';
import { type Progress, trainModel } from '../../../backend/src/modeling/train.js';
import { predict } from '../../../backend/src/modeling/tree-json.js';
import { isInternal, type TreeNode, treeNodeSchema } from '../../../shared/tree.js';
import { allowed, staffTable } from './staff-table.js';

function leafCount(node: TreeNode): number {
  return isInternal(node) ? leafCount(node.children[0]) + leafCount(node.children[1]) : 1;
}

describe('training a model run', () => {
  const { table, label } = staffTable(1500);

  it('cross-validates, prunes with the one-standard-error rule and returns plain JSON', () => {
    const progress: Progress[] = [];
    const result = trainModel(
      table,
      label,
      { features: allowed, maxDepth: 6, minLeaf: 10, k: 5, folds: 5, seed: 3, holdout: 0.2 },
      (p) => progress.push(p),
    );
    expect(treeNodeSchema.safeParse(result.tree).success).toBe(true);
    expect(JSON.parse(JSON.stringify(result)).tree).toEqual(result.tree);
    expect(result.pruning.rule).toBe('one-standard-error');
    // the chosen tree is no larger than the unpruned one
    const full = fitTree(table, label, { features: allowed, maxDepth: 6, minLeaf: 10, k: 5 }).tree;
    expect(leafCount(result.tree)).toBeLessThanOrEqual(leafCount(full));
    expect(result.pruning.path[0].alpha).toBe(0);
    const cv = result.crossValidation!;
    expect(cv.metrics.auc.values).toHaveLength(5);
    expect(cv.metrics.auc.mean).toBeGreaterThan(0.6);
    expect(cv.metrics.auc.sd).toBeGreaterThanOrEqual(0);
    expect(cv.pooled.calibration).toHaveLength(10);
    expect(cv.pooled.gains[9].positiveShare).toBeCloseTo(1, 12);
    expect(result.holdout!.metrics.auc).toBeGreaterThan(0.6);
    expect(result.trainingRows).toBe(1200);
    // progress only moves forward, ends at 1 and names each phase
    const values = progress.map((p) => p.progress);
    expect(values).toEqual([...values].sort((a, b) => a - b));
    expect(values.at(-1)).toBe(1);
    expect(new Set(progress.map((p) => p.phase))).toEqual(
      new Set(['fitting', 'cross-validating', 'pruning', 'explaining']),
    );
  });

  it('reports importance summing to one and a segment for every leaf', () => {
    const result = trainModel(table, label, { features: allowed, maxDepth: 3, minLeaf: 20, pruning: 'none' });
    const sum = result.importance.reduce((a, b) => a + b.importance, 0);
    expect(sum).toBeCloseTo(1, 12);
    expect(result.importance.map((i) => i.feature).sort()).toEqual([...allowed].sort());
    expect(result.segments).toHaveLength(leafCount(result.tree));
    expect(result.segments.reduce((a, s) => a + s.n, 0)).toBe(1500);
    for (const s of result.segments) {
      expect(s.share).toBeCloseTo(s.positive / s.n, 12);
      expect(s.lift).toBeCloseTo(s.share / result.baseRate, 12);
    }
  });

  it('raises minLeaf to k and says so', () => {
    const result = trainModel(table, label, { features: allowed, minLeaf: 3, k: 40, pruning: 'none' });
    expect(result.settings.effectiveMinLeaf).toBe(40);
    expect(result.settings.minLeafRaisedToK).toBe(true);
    for (const s of result.segments) expect(s.n).toBeGreaterThanOrEqual(40);
  });

  it('refuses an outcome with only one class', () => {
    expect(() =>
      trainModel(
        table,
        label.map(() => 0),
      ),
    ).toThrow(/only one class/);
  });

  it('predicts the same probabilities from the JSON as the leaf shares', () => {
    const result = trainModel(table, label, { features: allowed, maxDepth: 4, minLeaf: 25, pruning: 'none' });
    const p = predict(JSON.parse(JSON.stringify(result.tree)), table);
    expect(p.every((v) => v >= 0 && v <= 1)).toBe(true);
  });
});
