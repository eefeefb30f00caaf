import { isInternal, isWithheld, type TreeNode } from '../../../shared/tree.js';
import type { GrownTree } from './grow.js';
import { MISSING_CODE, type Table } from './table.js';

/**
 * The tree JSON of the HTTP contract from a grown tree. `isLeaf` (by node index) turns internal
 * nodes into leaves, which is how a pruned subtree is written.
 */
export function toTreeJson(tree: GrownTree, isLeaf?: (index: number) => boolean): TreeNode {
  const build = (index: number): TreeNode => {
    const node = tree.nodes[index];
    if (node.left < 0 || !node.split || isLeaf?.(index)) return { n: node.n, positive: node.positive };
    return {
      n: node.n,
      positive: node.positive,
      split: { ...node.split, ...(node.split.categories ? { categories: [...node.split.categories] } : {}) },
      children: [build(node.left), build(node.right)],
    };
  };
  return build(0);
}

/** A tree JSON flattened for fast row routing against one table. */
export type CompiledTree = {
  nodes: TreeNode[];
  /** path of each node from the root: '' for the root, then 'L'/'R' per step */
  paths: string[];
  left: Int32Array;
  right: Int32Array;
  /** per node: numeric values or categorical codes of the split column */
  numericValues: (Float64Array | null)[];
  categoricalCodes: (Int32Array | null)[];
  threshold: Float64Array;
  /** per node: leftCodes[code] === 1 sends the row left */
  leftCodes: (Uint8Array | null)[];
  missingGoesLeft: Uint8Array;
};

export function compileTree(tree: TreeNode, table: Table): CompiledTree {
  const nodes: TreeNode[] = [];
  const paths: string[] = [];
  const walk = (node: TreeNode, path: string) => {
    nodes.push(node);
    paths.push(path);
    if (isInternal(node)) {
      walk(node.children[0], path + 'L');
      walk(node.children[1], path + 'R');
    }
  };
  walk(tree, '');
  const count = nodes.length;
  const left = new Int32Array(count).fill(-1);
  const right = new Int32Array(count).fill(-1);
  const numericValues: (Float64Array | null)[] = new Array(count).fill(null);
  const categoricalCodes: (Int32Array | null)[] = new Array(count).fill(null);
  const threshold = new Float64Array(count);
  const leftCodes: (Uint8Array | null)[] = new Array(count).fill(null);
  const missingGoesLeft = new Uint8Array(count);
  const index = new Map(paths.map((p, i) => [p, i]));
  for (let i = 0; i < count; i++) {
    const node = nodes[i];
    if (!isInternal(node)) continue;
    left[i] = index.get(paths[i] + 'L')!;
    right[i] = index.get(paths[i] + 'R')!;
    const { split } = node;
    const column = table.columns.find((c) => c.name === split.feature);
    if (!column) throw new Error(`The table has no column "${split.feature}" used by the tree`);
    missingGoesLeft[i] = split.missingGoesLeft ? 1 : 0;
    if (split.kind === 'numeric') {
      if (column.kind !== 'numeric') throw new Error(`Column "${split.feature}" must be numeric`);
      numericValues[i] = column.values;
      threshold[i] = split.threshold ?? Number.NaN;
    } else {
      if (column.kind !== 'categorical') throw new Error(`Column "${split.feature}" must be categorical`);
      categoricalCodes[i] = column.codes;
      const wanted = new Set(split.categories ?? []);
      const mask = new Uint8Array(column.levels.length);
      column.levels.forEach((level, code) => {
        if (wanted.has(level)) mask[code] = 1;
      });
      leftCodes[i] = mask;
    }
  }
  return {
    nodes,
    paths,
    left,
    right,
    numericValues,
    categoricalCodes,
    threshold,
    leftCodes,
    missingGoesLeft,
  };
}

/** The child a row goes to from internal node `i`. */
export function route(tree: CompiledTree, i: number, row: number): number {
  const values = tree.numericValues[i];
  let goLeft: boolean;
  if (values) {
    const v = values[row];
    goLeft = Number.isNaN(v) ? tree.missingGoesLeft[i] === 1 : v <= tree.threshold[i];
  } else {
    const code = tree.categoricalCodes[i]![row];
    goLeft = code === MISSING_CODE ? tree.missingGoesLeft[i] === 1 : tree.leftCodes[i]![code] === 1;
  }
  return goLeft ? tree.left[i] : tree.right[i];
}

/** Index (in the compiled tree) of the leaf or withheld node each row reaches. */
export function leafIndices(tree: CompiledTree, rowCount: number): Int32Array {
  const out = new Int32Array(rowCount);
  for (let r = 0; r < rowCount; r++) {
    let i = 0;
    while (tree.left[i] >= 0) i = route(tree, i, r);
    out[r] = i;
  }
  return out;
}

/** Like leafIndices, for some rows only (result[i] belongs to rows[i]). */
export function leafIndicesOf(tree: CompiledTree, rows: ArrayLike<number>): Int32Array {
  const out = new Int32Array(rows.length);
  for (let k = 0; k < rows.length; k++) {
    let i = 0;
    while (tree.left[i] >= 0) i = route(tree, i, rows[k]);
    out[k] = i;
  }
  return out;
}

export function share(node: TreeNode): number {
  if (isWithheld(node) || node.n === 0) return Number.NaN;
  return node.positive / node.n;
}

/**
 * Probability of leaving for every row of the table: the share of leavers in the leaf the row
 * reaches (NaN where the path runs into a withheld node).
 */
export function predict(tree: TreeNode, table: Table): Float64Array {
  const compiled = compileTree(tree, table);
  const leaves = leafIndices(compiled, table.rowCount);
  const out = new Float64Array(table.rowCount);
  for (let r = 0; r < table.rowCount; r++) out[r] = share(compiled.nodes[leaves[r]]);
  return out;
}

/** The segment (leaf path id, e.g. "LRL") each row falls into. */
export function assignSegments(tree: TreeNode, table: Table): string[] {
  const compiled = compileTree(tree, table);
  const leaves = leafIndices(compiled, table.rowCount);
  return Array.from(leaves, (i) => segmentId(compiled.paths[i]));
}

export function segmentId(path: string): string {
  return path === '' ? 'root' : path;
}
