import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitTree } from '../../../backend/src/modeling/fit.js';
import { buildTable } from '../../../backend/src/modeling/table.js';
import { trainModel } from '../../../backend/src/modeling/train.js';
import { predict } from '../../../backend/src/modeling/tree-json.js';
import { isInternal, type TreeNode } from '../../../shared/tree.js';
import { allowed, staffTable } from './staff-table.js';

const rowArbitrary = fc.record({
  a: fc.option(fc.integer({ min: 0, max: 30 }), { nil: null }),
  b: fc.double({ min: -5, max: 5, noNaN: true }),
  c: fc.option(fc.constantFrom('N', 'E', 'S', 'W', 'X'), { nil: null }),
  y: fc.boolean(),
});

function tableOf(rows: Array<{ a: number | null; b: number; c: string | null; y: boolean }>) {
  return {
    table: buildTable([
      { name: 'a', kind: 'numeric', values: rows.map((r) => r.a) },
      { name: 'b', kind: 'numeric', values: rows.map((r) => r.b) },
      { name: 'c', kind: 'categorical', values: rows.map((r) => r.c) },
    ]),
    label: rows.map((r) => (r.y ? 1 : 0)),
  };
}

function leaves(node: TreeNode): Array<{ n: number; positive: number }> {
  if (isInternal(node)) return [...leaves(node.children[0]), ...leaves(node.children[1])];
  return 'n' in node ? [node] : [];
}

function features(node: TreeNode): string[] {
  return isInternal(node)
    ? [node.split.feature, ...features(node.children[0]), ...features(node.children[1])]
    : [];
}

describe('tree properties', () => {
  it('never builds a leaf smaller than max(minLeaf, k), and predictions lie in [0, 1]', () => {
    fc.assert(
      fc.property(
        fc.array(rowArbitrary, { minLength: 2, maxLength: 120 }),
        fc.integer({ min: 1, max: 15 }),
        fc.integer({ min: 1, max: 15 }),
        fc.constantFrom('gini' as const, 'entropy' as const),
        (rows, minLeaf, k, criterion) => {
          const { table, label } = tableOf(rows);
          const { tree } = fitTree(table, label, { minLeaf, k, criterion, maxDepth: 8, maxBins: 8 });
          const all = leaves(tree);
          if (all.length > 1)
            for (const leaf of all) expect(leaf.n).toBeGreaterThanOrEqual(Math.max(minLeaf, k));
          expect(all.reduce((s, l) => s + l.n, 0)).toBe(rows.length);
          for (const p of predict(tree, table)) expect(p >= 0 && p <= 1).toBe(true);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('trains deterministically for a seed', () => {
    const { table, label } = staffTable(400, 11);
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1000 }), (seed) => {
        const options = { features: allowed, maxDepth: 4, minLeaf: 10, seed, folds: 3 };
        const first = trainModel(table, label, options);
        const second = trainModel(table, label, options);
        expect(JSON.stringify(second)).toBe(JSON.stringify(first));
      }),
      { numRuns: 5 },
    );
  });

  it('never uses a blocked column, even when it is the most predictive one', () => {
    const { table, label } = staffTable(600, 5);
    // with every column allowed, the blocked one is the root split
    const open = fitTree(table, label, { maxDepth: 3, minLeaf: 10 }).tree;
    expect(isInternal(open) && open.split.feature).toBe('Age band');
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 6 }), fc.integer({ min: 1, max: 40 }), (maxDepth, minLeaf) => {
        const result = trainModel(table, label, { features: allowed, maxDepth, minLeaf, folds: 3 });
        expect(features(result.tree)).not.toContain('Age band');
        expect(result.importance.map((i) => i.feature)).not.toContain('Age band');
        expect(result.segments.map((s) => s.rule).join(' ')).not.toContain('Age band');
      }),
      { numRuns: 8 },
    );
  });
});
