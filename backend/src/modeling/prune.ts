import type { GrownTree } from './grow.js';

/**
 * Minimal cost-complexity pruning: R_α(T) = R(T) + α|T̃|, with R(t) the node's impurity times its
 * share of the root's weight, and α_eff(t) = (R(t) − R(T_t)) / (|T̃_t| − 1); the weakest link is
 * collapsed first (Breiman et al. 1984, ch. 3; the scikit-learn user guide, "Minimal
 * Cost-Complexity Pruning", whose path this reproduces node by node).
 */
export type PruningSequence = {
  /** α of each step, starting with 0 for the full tree (as scikit-learn's ccp_alphas) */
  alphas: number[];
  /** R(T) of the subtree after each step */
  impurities: number[];
  /** number of leaves after each step */
  leaves: number[];
  /** per node: the α at which it becomes a leaf (-Infinity for leaves of the full tree, +Infinity never) */
  collapseAlpha: Float64Array;
};

export function pruningSequence(tree: GrownTree): PruningSequence {
  const { nodes, totalWeight } = tree;
  const count = nodes.length;
  const rNode = new Float64Array(count);
  const rBranch = new Float64Array(count);
  const nLeaves = new Int32Array(count);
  const candidate = new Uint8Array(count);
  const collapseAlpha = new Float64Array(count).fill(Number.POSITIVE_INFINITY);
  for (let i = 0; i < count; i++) {
    rNode[i] = totalWeight > 0 ? (nodes[i].weight / totalWeight) * nodes[i].impurity : 0;
  }
  // children come after their parent in pre-order, so a reverse pass sees children first
  for (let i = count - 1; i >= 0; i--) {
    const node = nodes[i];
    if (node.left < 0) {
      nLeaves[i] = 1;
      rBranch[i] = rNode[i];
      collapseAlpha[i] = Number.NEGATIVE_INFINITY;
    } else {
      nLeaves[i] = nLeaves[node.left] + nLeaves[node.right];
      rBranch[i] = rBranch[node.left] + rBranch[node.right];
      candidate[i] = 1;
    }
  }
  const alphas = [0];
  const impurities = [rBranch[0]];
  const leaves = [nLeaves[0]];
  while (count > 0 && candidate[0] === 1) {
    let effective = Number.MAX_VALUE;
    let weakest = -1;
    for (let i = 0; i < count; i++) {
      if (candidate[i] !== 1) continue;
      const alpha = (rNode[i] - rBranch[i]) / (nLeaves[i] - 1);
      if (alpha < effective) {
        effective = alpha;
        weakest = i;
      }
    }
    if (weakest < 0) break;
    // the weakest node becomes a leaf; its descendants leave the subtree
    const stack = [nodes[weakest].left, nodes[weakest].right];
    while (stack.length > 0) {
      const j = stack.pop()!;
      candidate[j] = 0;
      if (nodes[j].left >= 0) stack.push(nodes[j].left, nodes[j].right);
    }
    candidate[weakest] = 0;
    collapseAlpha[weakest] = effective;
    const leavesRemoved = nLeaves[weakest] - 1;
    const rChange = rNode[weakest] - rBranch[weakest];
    for (let a = weakest; a >= 0; a = nodes[a].parent) {
      nLeaves[a] -= leavesRemoved;
      rBranch[a] += rChange;
    }
    alphas.push(effective);
    impurities.push(rBranch[0]);
    leaves.push(nLeaves[0]);
  }
  return { alphas, impurities, leaves, collapseAlpha };
}

/** Whether node i is a leaf of the subtree pruned at α (reachable nodes only). */
export function leafAtAlpha(sequence: PruningSequence, alpha: number): (index: number) => boolean {
  return (index) => sequence.collapseAlpha[index] <= alpha;
}
