export type Criterion = 'gini' | 'entropy';

/** Gini impurity of a two-class node with (weighted) totals. */
export function gini(total: number, positive: number): number {
  if (total <= 0) return 0;
  const p = positive / total;
  return 2 * p * (1 - p);
}

/** Entropy in bits of a two-class node with (weighted) totals. */
export function entropy(total: number, positive: number): number {
  if (total <= 0) return 0;
  const p = positive / total;
  if (p <= 0 || p >= 1) return 0;
  return -(p * Math.log2(p) + (1 - p) * Math.log2(1 - p));
}

export function impurity(criterion: Criterion, total: number, positive: number): number {
  return criterion === 'gini' ? gini(total, positive) : entropy(total, positive);
}

/**
 * Information gain of a split: parent impurity minus the children's impurity weighted by their
 * share of the parent. Each part is [total, positive].
 */
export function informationGain(criterion: Criterion, parts: Array<[number, number]>): number {
  let total = 0;
  let positive = 0;
  for (const [t, p] of parts) {
    total += t;
    positive += p;
  }
  let children = 0;
  for (const [t, p] of parts) children += (t / total) * impurity(criterion, t, p);
  return impurity(criterion, total, positive) - children;
}
