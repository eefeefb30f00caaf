import { describe, expect, it } from 'vitest';
import {
  aggregateAttributions,
  describeRule,
  describeSegments,
  formatNumber,
  pathAttributions,
} from '../../../backend/src/modeling/explain.js';
import { fitTree } from '../../../backend/src/modeling/fit.js';
import { buildTable } from '../../../backend/src/modeling/table.js';
import { assignSegments, predict } from '../../../backend/src/modeling/tree-json.js';
import { recountTree, withholdSmallNodes } from '../../../backend/src/modeling/withhold.js';
import { isInternal, isWithheld, type TreeNode } from '../../../shared/tree.js';
import { allowed, staffTable } from './staff-table.js';

describe('explaining a tree', () => {
  const { table, label } = staffTable(800);
  const { tree } = fitTree(table, label, { features: allowed, maxDepth: 3, minLeaf: 20, k: 5 });

  it('writes segment rules in plain words with the column names as given', () => {
    const rule = describeRule([
      {
        split: { feature: 'weekly overtime', kind: 'numeric', threshold: 10.5, missingGoesLeft: true },
        left: false,
      },
      { split: { feature: 'tenure', kind: 'numeric', threshold: 14.04, missingGoesLeft: false }, left: true },
    ]);
    expect(rule).toBe('weekly overtime above 10.5 and tenure up to 14');
    const region = describeRule([
      {
        split: {
          feature: 'Region',
          kind: 'categorical',
          categories: ['East', 'North'],
          missingGoesLeft: false,
        },
        left: true,
      },
    ]);
    expect(region).toBe('Region is East or North');
    expect(formatNumber(16.795)).toBe('16.8');
    expect(formatNumber(25000.5)).toBe('25,001');
  });

  it('merges two conditions on one column into a range', () => {
    const split = (threshold: number) => ({
      feature: 'tenure',
      kind: 'numeric' as const,
      threshold,
      missingGoesLeft: false,
    });
    expect(
      describeRule([
        { split: split(3.5), left: false },
        { split: split(14), left: true },
      ]),
    ).toBe('tenure above 3.5 and up to 14');
  });

  it('lists each leaf once, with the rows of the table falling into exactly one segment', () => {
    const segments = describeSegments(tree, table);
    const ids = assignSegments(tree, table);
    for (const s of segments) expect(ids.filter((id) => id === s.id)).toHaveLength(s.n);
  });

  it('credits each split on a path so that root share plus contributions is the leaf share', () => {
    const a = pathAttributions(tree, table);
    const p = predict(tree, table);
    for (let r = 0; r < table.rowCount; r++) {
      const total = a.values.reduce((sum, v) => sum + v[r], a.rootShare);
      expect(total).toBeCloseTo(p[r], 12);
    }
  });

  it('sets a team beside the organisation and withholds a team smaller than k', () => {
    const team = Array.from({ length: 40 }, (_, i) => i * 3);
    const result = aggregateAttributions({ tree }, table, team, { k: 5 });
    if (result.withheld) throw new Error('not expected to be withheld');
    expect(result.n).toBe(40);
    const contributions = result.drivers.reduce((s, d) => s + d.group, result.rootShare);
    expect(contributions).toBeCloseTo(result.groupPrediction, 12);
    expect(aggregateAttributions(tree, table, [1, 2, 3], { k: 5 })).toEqual({ withheld: true });
  });
});

describe('withholding small nodes', () => {
  const table = buildTable([{ name: 'x', kind: 'numeric', values: Array.from({ length: 40 }, (_, i) => i) }]);
  const label = Array.from({ length: 40 }, (_, i) => (i < 10 || i >= 35 ? 1 : 0));
  const { tree } = fitTree(table, label, { minLeaf: 1, k: 1, maxDepth: 3 });

  // US CMS cell size suppression policy, test points for k = 11: 0 shown, 1–10 withheld, 11 shown
  it('withholds nodes of 1 to k − 1 rows and shows 0 and k', () => {
    const leaf = (n: number): TreeNode => ({ n, positive: 0 });
    const parent = (a: number, b: number): TreeNode => ({
      n: a + b,
      positive: 0,
      split: { feature: 'x', kind: 'numeric', threshold: 1, missingGoesLeft: false },
      children: [leaf(a), leaf(b)],
    });
    expect(withholdSmallNodes(parent(0, 11), 11)).toEqual(parent(0, 11));
    const hidden = withholdSmallNodes(parent(10, 30), 11);
    if (!isInternal(hidden)) throw new Error('expected a split');
    // the sibling goes too, or 40 − 30 would reveal the 10 (complementary suppression)
    expect(hidden.children).toEqual([{ withheld: true }, { withheld: true }]);
    expect(withholdSmallNodes(parent(11, 30), 11)).toEqual(parent(11, 30));
    expect(withholdSmallNodes(leaf(1), 11)).toEqual({ withheld: true });
  });

  it('recounts a tree over a subgroup before withholding', () => {
    const team = [0, 1, 2, 3, 4, 5, 36, 37];
    const recounted = recountTree(tree, table, label, team);
    if (isWithheld(recounted)) throw new Error('unexpected');
    expect(recounted.n).toBe(8);
    expect(recounted.positive).toBe(8);
    const shown = withholdSmallNodes(recounted, 5);
    const sizes: number[] = [];
    const walk = (node: TreeNode) => {
      if (isWithheld(node)) return;
      sizes.push(node.n);
      if (isInternal(node)) node.children.forEach(walk);
    };
    walk(shown);
    for (const n of sizes) expect(n === 0 || n >= 5).toBe(true);
  });
});
