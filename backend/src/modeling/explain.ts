import { isInternal, isWithheld, type Split, type TreeNode } from '../../../shared/tree.js';
import type { GrownTree } from './grow.js';
import type { Table } from './table.js';
import { compileTree, route, segmentId, share } from './tree-json.js';

export type Importance = { feature: string; importance: number };

/**
 * Total weighted impurity decrease per feature over the splits kept, normalised to sum to 1
 * (Breiman et al. 1984, §5.3.4; scikit-learn's feature_importances_).
 */
export function featureImportance(tree: GrownTree, isLeaf?: (index: number) => boolean): Importance[] {
  const totals = new Float64Array(tree.features.length);
  const visit = (i: number) => {
    const node = tree.nodes[i];
    if (node.left < 0 || isLeaf?.(i)) return;
    totals[node.feature] += node.improvement;
    visit(node.left);
    visit(node.right);
  };
  visit(0);
  const sum = totals.reduce((a, b) => a + b, 0);
  return tree.features
    .map((f, i) => ({ feature: f.name, importance: sum > 0 ? totals[i] / sum : 0 }))
    .sort((a, b) => b.importance - a.importance || a.feature.localeCompare(b.feature));
}

export type Segment = {
  /** the leaf's path from the root ('L'/'R' per step), stable for a given tree */
  id: string;
  rule: string;
  n: number;
  positive: number;
  /** leavers / employees in the segment */
  share: number;
  /** share divided by the whole population's share */
  lift: number;
};

type Condition = { split: Split; left: boolean };

/** Numbers in rules: three significant figures, whole numbers from 1,000 up. */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (Math.abs(x) >= 1000) return Math.round(x).toLocaleString('en-GB');
  return String(Number(x.toPrecision(3)));
}

function listLevels(levels: string[]): string {
  if (levels.length <= 1) return levels[0] ?? '(none)';
  return `${levels.slice(0, -1).join(', ')} or ${levels[levels.length - 1]}`;
}

/**
 * A segment's rule in plain words: "Weekly overtime above 10.5 and Tenure up to 14". Conditions on
 * the same numeric column merge into one range; on the same categorical column, into one list.
 */
export function describeRule(conditions: Condition[], table?: Table): string {
  if (conditions.length === 0) return 'Everyone';
  const order: string[] = [];
  const numeric = new Map<string, { low: number; high: number; missing: boolean | null }>();
  const categorical = new Map<
    string,
    { allowed: Set<string> | null; excluded: Set<string>; missing: boolean | null }
  >();
  for (const { split, left } of conditions) {
    if (!order.includes(split.feature)) order.push(split.feature);
    const missingHere = split.missingGoesLeft === left;
    if (split.kind === 'numeric') {
      const c = numeric.get(split.feature) ?? { low: -Infinity, high: Infinity, missing: null };
      const t = split.threshold ?? Number.NaN;
      if (left) c.high = Math.min(c.high, t);
      else c.low = Math.max(c.low, t);
      c.missing = c.missing === null ? missingHere : c.missing && missingHere;
      numeric.set(split.feature, c);
    } else {
      const c = categorical.get(split.feature) ?? {
        allowed: null,
        excluded: new Set<string>(),
        missing: null,
      };
      const cats = split.categories ?? [];
      if (left) c.allowed = new Set([...(c.allowed ?? cats)].filter((x) => cats.includes(x)));
      else for (const x of cats) c.excluded.add(x);
      c.missing = c.missing === null ? missingHere : c.missing && missingHere;
      categorical.set(split.feature, c);
    }
  }
  // "or not recorded" only where the column has missing values at all
  const hasMissing = (feature: string) => {
    const column = table?.columns.find((c) => c.name === feature);
    if (!column) return true;
    if (column.kind === 'numeric') return column.values.some((v) => Number.isNaN(v));
    return column.codes.some((c) => c < 0);
  };
  const parts = order.map((feature) => {
    const num = numeric.get(feature);
    if (num) {
      const range =
        num.low > -Infinity && num.high < Infinity
          ? `${feature} above ${formatNumber(num.low)} and up to ${formatNumber(num.high)}`
          : num.low > -Infinity
            ? `${feature} above ${formatNumber(num.low)}`
            : `${feature} up to ${formatNumber(num.high)}`;
      return num.missing && hasMissing(feature) ? `${range} or not recorded` : range;
    }
    const cat = categorical.get(feature)!;
    const column = table?.columns.find((c) => c.name === feature);
    const allLevels = column?.kind === 'categorical' ? column.levels : null;
    let text: string;
    if (cat.allowed) {
      text = `${feature} is ${listLevels([...cat.allowed].filter((x) => !cat.excluded.has(x)))}`;
    } else if (allLevels) {
      const kept = allLevels.filter((x) => !cat.excluded.has(x));
      text =
        kept.length <= cat.excluded.size
          ? `${feature} is ${listLevels(kept)}`
          : `${feature} is not ${listLevels([...cat.excluded])}`;
    } else text = `${feature} is not ${listLevels([...cat.excluded])}`;
    return cat.missing && hasMissing(feature) ? `${text} or not recorded` : text;
  });
  return parts.join(' and ');
}

/** Every leaf of the tree as a segment; withheld leaves are left out. */
export function describeSegments(tree: TreeNode, table?: Table): Segment[] {
  const rootShare = share(tree);
  const segments: Segment[] = [];
  const walk = (node: TreeNode, path: string, conditions: Condition[]) => {
    if (isWithheld(node)) return;
    if (isInternal(node)) {
      walk(node.children[0], path + 'L', [...conditions, { split: node.split, left: true }]);
      walk(node.children[1], path + 'R', [...conditions, { split: node.split, left: false }]);
      return;
    }
    const s = share(node);
    segments.push({
      id: segmentId(path),
      rule: describeRule(conditions, table),
      n: node.n,
      positive: node.positive,
      share: s,
      lift: rootShare > 0 ? s / rootShare : Number.NaN,
    });
  };
  walk(tree, '', []);
  return segments;
}

export type RowAttributions = {
  features: string[];
  /** the root's share of leavers: every row's starting point */
  rootShare: number;
  /** per feature, per row: the change in leaver share credited to that feature */
  values: Float64Array[];
  /** per row: the leaf's share (rootShare + the row's contributions) */
  prediction: Float64Array;
};

/**
 * Path attribution: at each split on a row's path, the change in leaver share from parent to
 * child is credited to the split's feature, so root share + contributions = the leaf's share.
 */
export function pathAttributions(tree: TreeNode, table: Table): RowAttributions {
  const compiled = compileTree(tree, table);
  const features: string[] = [];
  const featureOf = new Int32Array(compiled.nodes.length).fill(-1);
  compiled.nodes.forEach((node, i) => {
    if (!isInternal(node)) return;
    let f = features.indexOf(node.split.feature);
    if (f < 0) f = features.push(node.split.feature) - 1;
    featureOf[i] = f;
  });
  const values = features.map(() => new Float64Array(table.rowCount));
  const prediction = new Float64Array(table.rowCount);
  const shares = compiled.nodes.map(share);
  for (let r = 0; r < table.rowCount; r++) {
    let i = 0;
    while (compiled.left[i] >= 0) {
      const next = route(compiled, i, r);
      values[featureOf[i]][r] += shares[next] - shares[i];
      i = next;
    }
    prediction[r] = shares[i];
  }
  return { features, rootShare: shares[0], values, prediction };
}

export type Driver = {
  feature: string;
  /** mean contribution to the leaver share over the group's rows */
  group: number;
  /** mean contribution over every row of the table */
  organisation: number;
  /** group − organisation: positive means this factor raises the group's risk more than usual */
  difference: number;
};

export type GroupAttribution =
  | { withheld: true }
  | {
      withheld: false;
      n: number;
      /** mean predicted share of leavers in the group and in the whole table */
      groupPrediction: number;
      organisationPrediction: number;
      rootShare: number;
      /** by absolute difference, largest first */
      drivers: Driver[];
    };

/**
 * Averages path attributions over a group of rows (a team) and sets them beside the whole table's
 * (the organisation). A group of fewer than k rows is withheld. Pass `attributions` (from
 * pathAttributions on the same tree and table) to reuse them across many teams.
 */
export function aggregateAttributions(
  model: TreeNode | { tree: TreeNode },
  table: Table,
  rowIndices: ArrayLike<number>,
  options: { k?: number; attributions?: RowAttributions } = {},
): GroupAttribution {
  if (rowIndices.length === 0 || rowIndices.length < (options.k ?? 1)) return { withheld: true };
  const tree = 'tree' in model ? model.tree : model;
  const a = options.attributions ?? pathAttributions(tree, table);
  const mean = (values: Float64Array, rows?: ArrayLike<number>) => {
    let sum = 0;
    if (rows) for (let i = 0; i < rows.length; i++) sum += values[rows[i]];
    else for (let i = 0; i < values.length; i++) sum += values[i];
    const count = rows ? rows.length : values.length;
    return count > 0 ? sum / count : Number.NaN;
  };
  const drivers = a.features
    .map((feature, f) => {
      const group = mean(a.values[f], rowIndices);
      const organisation = mean(a.values[f]);
      return { feature, group, organisation, difference: group - organisation };
    })
    .sort((x, y) => Math.abs(y.difference) - Math.abs(x.difference) || x.feature.localeCompare(y.feature));
  return {
    withheld: false,
    n: rowIndices.length,
    groupPrediction: mean(a.prediction, rowIndices),
    organisationPrediction: mean(a.prediction),
    rootShare: a.rootShare,
    drivers,
  };
}
