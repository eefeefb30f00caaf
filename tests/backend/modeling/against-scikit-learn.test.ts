import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fitTree } from '../../../backend/src/modeling/fit.js';
import { rocAuc } from '../../../backend/src/modeling/metrics.js';
import { pruningSequence } from '../../../backend/src/modeling/prune.js';
import { buildTable, selectRows, type Table } from '../../../backend/src/modeling/table.js';
import { trainModel } from '../../../backend/src/modeling/train.js';
import { predict } from '../../../backend/src/modeling/tree-json.js';
import { isInternal, type TreeNode } from '../../../shared/tree.js';

// Made by tests/fixtures/make-sklearn-fixtures.py with Debian's scikit-learn 1.2.1 (see the script)
type Fixture = {
  featureNames: string[];
  rows: number[][];
  malignant: number[];
  trainIndices: number[];
  testIndices: number[];
  depthOneRoot: { feature: string; threshold: number; left: [number, number]; right: [number, number] };
  pruningPath: { alphas: number[]; impurities: number[] };
  holdoutAuc: Array<{
    criterion: 'gini' | 'entropy';
    max_depth: number;
    min_samples_leaf: number;
    aucs: number[];
    leaves: Array<[number, number]>;
  }>;
};
const fixture: Fixture = JSON.parse(
  readFileSync(new URL('../../fixtures/sklearn-breast-cancer.json', import.meta.url), 'utf8'),
);

const table: Table = buildTable(
  fixture.featureNames.map((name, j) => ({ name, kind: 'numeric', values: fixture.rows.map((r) => r[j]) })),
);
const pick = <T>(values: T[], rows: number[]) => rows.map((i) => values[i]);
// every distinct value gets its own bin, as in a sort-based tree
const exact = { maxBins: 65535, k: 1 };

describe('breast cancer trees against scikit-learn 1.2.1', () => {
  it('splits the root on worst radius 16.80 with [33, 346] | [179, 11]', () => {
    const { tree } = fitTree(table, fixture.malignant, { ...exact, maxDepth: 1, minLeaf: 1 });
    if (!isInternal(tree)) throw new Error('expected a split');
    const [left, right] = tree.children;
    expect(tree.split.feature).toBe(fixture.depthOneRoot.feature);
    // scikit-learn works in float32, so its midpoint differs in the seventh digit
    expect(tree.split.threshold).toBeCloseTo(fixture.depthOneRoot.threshold, 5);
    expect(tree.split.threshold).toBeCloseTo(16.8, 2);
    const malignantBenign = (n: typeof left) => ('n' in n ? [n.positive, n.n - n.positive] : []);
    expect(malignantBenign(left)).toEqual([33, 346]);
    expect(malignantBenign(right)).toEqual([179, 11]);
  });

  it('finds the same cost-complexity pruning path, ending 0.0231416, 0.0342247, 0.3272984', () => {
    const train = selectRows(table, fixture.trainIndices);
    const { grown } = fitTree(train, pick(fixture.malignant, fixture.trainIndices), {
      ...exact,
      minLeaf: 1,
      maxDepth: 1000,
    });
    const sequence = pruningSequence(grown);
    expect(sequence.alphas).toHaveLength(13);
    sequence.alphas.forEach((alpha, i) => {
      expect(alpha).toBeCloseTo(fixture.pruningPath.alphas[i], 9);
      expect(sequence.impurities[i]).toBeCloseTo(fixture.pruningPath.impurities[i], 9);
    });
    expect(sequence.alphas.slice(-3).map((a) => a.toFixed(10))).toEqual([
      '0.0231416275',
      '0.0342247477',
      '0.3272984419',
    ]);
  });

  it('chooses α by cross-validation among the geometric means of that path', () => {
    const train = selectRows(table, fixture.trainIndices);
    const result = trainModel(train, pick(fixture.malignant, fixture.trainIndices), {
      ...exact,
      minLeaf: 1,
      maxDepth: 1000,
      pruning: 'cv',
      folds: 5,
      seed: 4,
    });
    const a = fixture.pruningPath.alphas;
    const expected = a.map((alpha, i) => (i + 1 < a.length ? Math.sqrt(alpha * a[i + 1]) : alpha));
    result.pruning.path.forEach((step, i) => {
      expect(step.alpha).toBeCloseTo(expected[i], 9);
    });
    expect(expected.map((x) => x.toFixed(9))).toContain(result.pruning.alpha.toFixed(9));
    // the one-standard-error rule picks a tree no larger than the one with the lowest error
    const best = result.pruning.path.reduce((b, s) => (s.cvError < b.cvError ? s : b));
    const chosen = result.pruning.path.find((s) => s.alpha === result.pruning.alpha)!;
    expect(chosen.leaves).toBeLessThanOrEqual(best.leaves);
    expect(chosen.cvError).toBeLessThanOrEqual(best.cvError + best.cvStandardError);
    expect(result.segments.length).toBe(chosen.leaves);
  });

  for (const reference of fixture.holdoutAuc) {
    const { criterion, max_depth: maxDepth, min_samples_leaf: minLeaf } = reference;
    const settings = `${criterion}, depth ${maxDepth}, min leaf ${minLeaf}`;
    const fitTrain = (maxBins: number) =>
      fitTree(selectRows(table, fixture.trainIndices), pick(fixture.malignant, fixture.trainIndices), {
        criterion,
        maxDepth,
        minLeaf,
        k: 1,
        maxBins,
      }).tree;

    it(`grows the same training leaves (${settings})`, () => {
      const leaves: Array<[number, number]> = [];
      const walk = (node: TreeNode) => {
        if (isInternal(node)) node.children.forEach(walk);
        else if ('n' in node) leaves.push([node.n, node.positive]);
      };
      walk(fitTrain(65535));
      expect(leaves.sort((a, b) => a[0] - b[0] || a[1] - b[1])).toEqual(reference.leaves);
    });

    // equally good splits on different features are chosen at random by scikit-learn, so the
    // holdout AUC is compared with the range over its 20 seeds
    it(`has a holdout AUC within 0.01 of scikit-learn's (${settings})`, () => {
      const scores = predict(fitTrain(65535), selectRows(table, fixture.testIndices));
      const auc = rocAuc(pick(fixture.malignant, fixture.testIndices), scores);
      expect(auc).toBeGreaterThanOrEqual(Math.min(...reference.aucs) - 0.01);
      expect(auc).toBeLessThanOrEqual(Math.max(...reference.aucs) + 0.01);
    });

    // 426 rows have more distinct values than 256 bins: quantile bins may move thresholds
    it(`loses no more than 0.01 of AUC with the default 256 quantile bins (${settings})`, () => {
      const scores = predict(fitTrain(256), selectRows(table, fixture.testIndices));
      const auc = rocAuc(pick(fixture.malignant, fixture.testIndices), scores);
      expect(auc).toBeGreaterThanOrEqual(Math.min(...reference.aucs) - 0.01);
    });
  }
});
