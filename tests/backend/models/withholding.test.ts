import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildTable } from '../../../backend/src/modeling/table';
import { evaluate, trainModel } from '../../../backend/src/modeling/train';
import { predict } from '../../../backend/src/modeling/tree-json';
import { type StoredResult, toResultView } from '../../../backend/src/modules/models/result-view';
import type { ModelResultView } from '../../../shared/models';
import { isInternal, isWithheld, type TreeNode } from '../../../shared/tree';

const rowArbitrary = fc.record({
  tenure: fc.option(fc.integer({ min: 0, max: 40 }), { nil: null }),
  overtime: fc.double({ min: 0, max: 20, noNaN: true }),
  depot: fc.option(fc.constantFrom('Ashby', 'Brook', 'Cole', 'Dunmere'), { nil: null }),
  left: fc.boolean(),
});

type Row = { tenure: number | null; overtime: number; depot: string | null; left: boolean };

function stored(rows: Row[], trainingK: number, pruning: 'cv' | 'none'): StoredResult {
  const table = buildTable([
    { name: 'Tenure', kind: 'numeric', values: rows.map((r) => r.tenure) },
    { name: 'Overtime', kind: 'numeric', values: rows.map((r) => r.overtime) },
    { name: 'Depot', kind: 'categorical', values: rows.map((r) => r.depot) },
  ]);
  const label = rows.map((r) => (r.left ? 1 : 0));
  const result = trainModel(table, label, { k: trainingK, minLeaf: 1, maxDepth: 5, folds: 3, pruning });
  const inSample = result.crossValidation
    ? null
    : evaluate(label, predict(result.tree, table), result.settings.threshold);
  return { ...result, inSample };
}

function nodes(node: TreeNode): TreeNode[] {
  return isInternal(node) ? [node, ...nodes(node.children[0]), ...nodes(node.children[1])] : [node];
}

/** Every count a response carries, with what it counts: none may be 1 to k − 1. */
function countsShown(view: ModelResultView): { what: string; n: number }[] {
  const out: { what: string; n: number }[] = [];
  for (const node of nodes(view.tree)) if (!isWithheld(node)) out.push({ what: 'tree node', n: node.n });
  for (const s of view.segments) if (!s.withheld) out.push({ what: `segment ${s.id}`, n: s.n });
  for (const bin of view.calibration)
    if (!('withheld' in bin)) out.push({ what: 'calibration bin', n: bin.n });
  if (!('withheld' in view.confusion)) {
    const c = view.confusion;
    for (const [what, n] of Object.entries({
      truePositive: c.truePositive,
      falsePositive: c.falsePositive,
      trueNegative: c.trueNegative,
      falseNegative: c.falseNegative,
    }))
      if (n > 0) out.push({ what, n });
  }
  return out;
}

describe('what a model run response may show', () => {
  it('never shows a node, segment or figure about fewer than k employees, for any data and k', () => {
    fc.assert(
      fc.property(
        fc.array(rowArbitrary, { minLength: 12, maxLength: 120 }),
        fc.integer({ min: 2, max: 6 }),
        fc.integer({ min: 0, max: 12 }),
        fc.constantFrom('cv' as const, 'none' as const),
        (rows, trainingK, raise, pruning) => {
          const leavers = rows.filter((r) => r.left).length;
          fc.pre(leavers > 0 && leavers < rows.length);
          // the policy's k may have gone up since the run was trained
          const k = trainingK + raise;
          const view = toResultView(stored(rows, trainingK, pruning), k, {});
          for (const { what, n } of countsShown(view)) expect(n, what).toBeGreaterThanOrEqual(k);
          // a withheld node carries nothing else
          for (const node of nodes(view.tree))
            if (isWithheld(node)) expect(Object.keys(node)).toEqual(['withheld']);
          // ROC steps: leavers plus stayers between two points shown, from the rates and totals
          const positives = view.positive;
          const negatives = view.rowCount - view.positive;
          for (let i = 1; i < view.roc.length - 1; i++) {
            const step =
              (view.roc[i].truePositiveRate - view.roc[i - 1].truePositiveRate) * positives +
              (view.roc[i].falsePositiveRate - view.roc[i - 1].falsePositiveRate) * negatives;
            expect(step).toBeGreaterThanOrEqual(k - 1e-6);
          }
        },
      ),
      { numRuns: 60, seed: 20261201 },
    );
  });

  it('withholds the sibling of a withheld node too, so subtraction cannot recover it', () => {
    const tree: TreeNode = {
      n: 40,
      positive: 10,
      split: { feature: 'Overtime', kind: 'numeric', threshold: 5, missingGoesLeft: true },
      children: [
        { n: 37, positive: 8 },
        { n: 3, positive: 2 },
      ],
    };
    const view = toResultView(
      {
        ...stored(
          Array.from({ length: 40 }, (_, i) => ({
            tenure: i,
            overtime: i % 7,
            depot: 'Ashby',
            left: i % 4 === 0,
          })),
          2,
          'none',
        ),
        tree,
        segments: [
          { id: 'L', rule: 'Overtime up to 5', n: 37, positive: 8, share: 8 / 37, lift: 1 },
          { id: 'R', rule: 'Overtime above 5', n: 3, positive: 2, share: 2 / 3, lift: 2 },
        ],
      },
      5,
      {},
    );
    expect(view.tree).toEqual({
      n: 40,
      positive: 10,
      split: expect.anything(),
      children: [{ withheld: true }, { withheld: true }],
    });
    expect(view.segments).toEqual([
      { id: 'L', withheld: true },
      { id: 'R', withheld: true },
    ]);
  });
});
