import { isInternal, isWithheld, type TreeNode } from '../../../shared/tree.js';
import type { Table } from './table.js';
import { compileTree, leafIndices } from './tree-json.js';

/**
 * The same tree with `n` and `positive` counted over some rows only (a team, a department): how a
 * tree is evaluated on a subgroup before it is shown.
 */
export function recountTree(
  tree: TreeNode,
  table: Table,
  label: ArrayLike<number>,
  rowIndices: ArrayLike<number>,
): TreeNode {
  const compiled = compileTree(tree, table);
  const n = new Int32Array(compiled.nodes.length);
  const positive = new Int32Array(compiled.nodes.length);
  const leaves = leafIndices(compiled, table.rowCount);
  const parentOf = new Int32Array(compiled.nodes.length).fill(-1);
  for (let i = 0; i < compiled.nodes.length; i++) {
    if (compiled.left[i] >= 0) {
      parentOf[compiled.left[i]] = i;
      parentOf[compiled.right[i]] = i;
    }
  }
  for (let k = 0; k < rowIndices.length; k++) {
    const r = rowIndices[k];
    for (let i = leaves[r]; i >= 0; i = parentOf[i]) {
      n[i]++;
      positive[i] += label[r] ? 1 : 0;
    }
  }
  let next = 0;
  const build = (node: TreeNode): TreeNode => {
    const i = next++;
    if (isWithheld(node)) return node;
    if (!isInternal(node)) return { n: n[i], positive: positive[i] };
    const left = build(node.children[0]);
    const right = build(node.children[1]);
    return { n: n[i], positive: positive[i], split: node.split, children: [left, right] };
  };
  return build(tree);
}

/**
 * Withholds every node about 1 to k − 1 employees, with its subtree (an empty node shows 0, as in
 * small-cell suppression policies such as the US CMS cell size suppression policy). Where only one
 * of two siblings is withheld, the other is withheld too, or the parent's count minus the shown
 * sibling's would reveal it (complementary suppression: Statistics Netherlands, 2010).
 */
export function withholdSmallNodes(tree: TreeNode, k: number): TreeNode {
  const small = (node: TreeNode) => !isWithheld(node) && node.n > 0 && node.n < k;
  const visit = (node: TreeNode): TreeNode => {
    if (isWithheld(node) || small(node)) return { withheld: true };
    if (!isInternal(node)) return { n: node.n, positive: node.positive };
    let left = visit(node.children[0]);
    let right = visit(node.children[1]);
    if (isWithheld(left) !== isWithheld(right)) {
      left = { withheld: true };
      right = { withheld: true };
    }
    return { n: node.n, positive: node.positive, split: node.split, children: [left, right] };
  };
  return visit(tree);
}
