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

describe('categorical splits', () => {
  // Breiman et al. (1984); Hastie, Tibshirani & Friedman, ESL 2nd ed. §9.2.4: for a 0/1 outcome,
  // ordering the levels by share of class 1 finds the best of all 2^(q−1) − 1 subsets
  it('are as good as the best of all subsets of levels', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ level: fc.constantFrom('A', 'B', 'C', 'D', 'E', 'F'), y: fc.boolean() }), {
          minLength: 2,
          maxLength: 80,
        }),
        fc.constantFrom('gini' as const, 'entropy' as const),
        (rows, criterion) => {
          const table = buildTable([
            { name: 'level', kind: 'categorical', values: rows.map((r) => r.level) },
          ]);
          const label: number[] = rows.map((r) => (r.y ? 1 : 0));
          const impurity = (n: number, p: number) => {
            if (n === 0 || p === 0 || p === n) return 0;
            const q = p / n;
            return criterion === 'gini' ? 2 * q * (1 - q) : -(q * Math.log2(q) + (1 - q) * Math.log2(1 - q));
          };
          const childCost = (inLeft: (level: string) => boolean) => {
            let nl = 0;
            let pl = 0;
            for (const r of rows) {
              if (inLeft(r.level)) {
                nl++;
                pl += r.y ? 1 : 0;
              }
            }
            const nr = rows.length - nl;
            const pr = label.reduce((a, b) => a + b, 0) - pl;
            return nl === 0 || nr === 0
              ? Number.POSITIVE_INFINITY
              : nl * impurity(nl, pl) + nr * impurity(nr, pr);
          };
          const levels: string[] = [...new Set(rows.map((r) => r.level))];
          let bruteForce = Number.POSITIVE_INFINITY;
          for (let mask = 1; mask < 2 ** levels.length - 1; mask++) {
            bruteForce = Math.min(
              bruteForce,
              childCost((l) => ((mask >> levels.indexOf(l)) & 1) === 1),
            );
          }
          const { tree } = fitTree(table, label, { criterion, minLeaf: 1, k: 1, maxDepth: 1 });
          if (!isInternal(tree)) {
            // no split only when nothing can be gained: a pure node or a single level
            expect(levels.length === 1 || label.every((y) => y === label[0])).toBe(true);
            return;
          }
          const left = new Set(tree.split.categories);
          expect(childCost((l) => left.has(l))).toBeCloseTo(bruteForce, 9);
        },
      ),
      { numRuns: 300 },
    );
  });
});
