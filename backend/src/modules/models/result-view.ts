import type {
  HeadlineMetrics,
  ModelDriver,
  ModelResultView,
  ModelSegment,
  Spread,
} from '../../../../shared/models';
import { isInternal, isWithheld, type TreeNode } from '../../../../shared/tree';
import type { Segment } from '../../modeling/explain';
import type { Evaluation, ModelResult } from '../../modeling/train';
import { withholdSmallNodes } from '../../modeling/withhold';

/** What a finished run stores: the engine's result, and the in-sample evaluation when there was no cross-validation. */
export type StoredResult = ModelResult & { inSample: Evaluation | null };

/** JSON turns NaN into null; the views say null for "not defined here". */
const num = (x: number | null | undefined): number => (typeof x === 'number' ? x : Number.NaN);

function headline(metrics: Record<keyof HeadlineMetrics, number>): HeadlineMetrics {
  return {
    auc: num(metrics.auc),
    precision: num(metrics.precision),
    recall: num(metrics.recall),
    accuracy: num(metrics.accuracy),
    f1: num(metrics.f1),
    brier: num(metrics.brier),
    averagePrecision: num(metrics.averagePrecision),
    baseRate: num(metrics.baseRate),
  };
}

const share = (node: TreeNode) => (isWithheld(node) || node.n === 0 ? Number.NaN : node.positive / node.n);
const percent = (x: number) => `${Math.round(x * 100)}%`;

function splitsOn(tree: TreeNode, feature: string): Extract<TreeNode, { split: unknown }>[] {
  const out: Extract<TreeNode, { split: unknown }>[] = [];
  const walk = (node: TreeNode) => {
    if (!isInternal(node)) return;
    if (node.split.feature === feature) out.push(node);
    walk(node.children[0]);
    walk(node.children[1]);
  };
  walk(tree);
  return out;
}

/**
 * Which values of a feature raise the leaver share, in words, read from the tree's splits on it:
 * each split weighs by its employees times the gap between its two sides. Shares are quoted only
 * for sides of at least k employees.
 */
export function describeDirection(
  tree: TreeNode,
  feature: string,
  k: number,
): { direction: string; trend: ModelDriver['trend'] } {
  const splits = splitsOn(tree, feature);
  if (splits.length === 0) return { direction: 'Not used by the pruned tree.', trend: 'mixed' };
  let up = 0;
  let down = 0;
  let heaviest = splits[0];
  let heaviestWeight = -1;
  for (const node of splits) {
    const [left, right] = node.children;
    const gap = share(right) - share(left);
    const weight = node.n * Math.abs(gap || 0);
    if (gap > 0) up += weight;
    else down += weight;
    if (weight > heaviestWeight) {
      heaviest = node;
      heaviestWeight = weight;
    }
  }
  const [left, right] = heaviest.children;
  const quote =
    !isWithheld(left) && !isWithheld(right) && left.n >= k && right.n >= k
      ? ` (${percent(Math.max(share(left), share(right)))} against ${percent(
          Math.min(share(left), share(right)),
        )} leave in the largest split)`
      : '';
  const { split } = heaviest;
  if (split.kind === 'numeric') {
    const total = up + down;
    if (total > 0 && Math.min(up, down) > 0.2 * total) {
      return {
        direction: `Mixed: higher values raise the leaver share in some segments and lower it in others${quote}.`,
        trend: 'mixed',
      };
    }
    const threshold = Number((split.threshold ?? Number.NaN).toPrecision(3));
    return up >= down
      ? { direction: `Higher values raise the leaver share: above ${threshold}${quote}.`, trend: 'raises' }
      : { direction: `Lower values raise the leaver share: up to ${threshold}${quote}.`, trend: 'lowers' };
  }
  const categories = split.categories ?? [];
  const list =
    categories.length <= 1
      ? (categories[0] ?? '(none)')
      : `${categories.slice(0, -1).join(', ')} or ${categories.at(-1)}`;
  return {
    direction:
      share(left) >= share(right)
        ? `${feature} ${list} raises the leaver share${quote}.`
        : `${feature} other than ${list} raises the leaver share${quote}.`,
    trend: 'mixed',
  };
}

/** Drivers: features by importance, each with its direction and the analyst's suggested action. */
export function buildDrivers(
  result: Pick<ModelResult, 'tree' | 'importance'>,
  k: number,
  actions: Record<string, string>,
): ModelDriver[] {
  return result.importance
    .filter((item) => item.importance > 0)
    .map((item) => ({
      feature: item.feature,
      importance: item.importance,
      ...describeDirection(result.tree, item.feature, k),
      suggestedAction: actions[item.feature] ?? '',
    }));
}

/** Paths ('L'/'R' per step) of the leaves still shown in a withheld tree. */
function shownLeafPaths(tree: TreeNode): Set<string> {
  const out = new Set<string>();
  const walk = (node: TreeNode, path: string) => {
    if (isWithheld(node)) return;
    if (isInternal(node)) {
      walk(node.children[0], `${path}L`);
      walk(node.children[1], `${path}R`);
    } else out.add(path === '' ? 'root' : path);
  };
  walk(tree, '');
  return out;
}

export function withholdSegments(segments: Segment[], withheldTree: TreeNode, k: number): ModelSegment[] {
  const shown = shownLeafPaths(withheldTree);
  return segments.map((s) =>
    s.n < k || !shown.has(s.id)
      ? { id: s.id, withheld: true }
      : {
          id: s.id,
          withheld: false,
          rule: s.rule,
          n: s.n,
          positive: s.positive,
          share: num(s.share),
          lift: num(s.lift),
        },
  );
}

/**
 * ROC points such that every step between two points shown covers at least k employees: with the
 * totals, a smaller step would say how many leavers a small group holds.
 */
export function coarsenRoc(evaluation: Evaluation, k: number): ModelResultView['roc'] {
  const c = evaluation.confusion;
  const positives = c.truePositive + c.falseNegative;
  const negatives = c.falsePositive + c.trueNegative;
  const points = [...evaluation.roc].sort(
    (a, b) => a.falsePositiveRate - b.falsePositiveRate || a.truePositiveRate - b.truePositiveRate,
  );
  const out: ModelResultView['roc'] = [];
  let last = { falsePositiveRate: 0, truePositiveRate: 0 };
  for (const [i, p] of points.entries()) {
    const rows =
      (p.truePositiveRate - last.truePositiveRate) * positives +
      (p.falsePositiveRate - last.falsePositiveRate) * negatives;
    const isEnd = i === points.length - 1;
    const isStart = p.falsePositiveRate === 0 && p.truePositiveRate === 0;
    if (isStart || rows >= k - 1e-9 || isEnd) {
      out.push({
        threshold: num(p.threshold),
        falsePositiveRate: p.falsePositiveRate,
        truePositiveRate: p.truePositiveRate,
      });
      last = p;
    }
  }
  return out;
}

/** A 2×2 table: withheld whole when any cell is about 1 to k − 1 employees (one cell alone would be recovered from the totals). */
function withholdConfusion(evaluation: Evaluation, k: number): ModelResultView['confusion'] {
  const c = evaluation.confusion;
  const cells = [c.truePositive, c.falsePositive, c.trueNegative, c.falseNegative];
  if (cells.some((n) => n > 0 && n < k)) return { withheld: true };
  return { ...c, threshold: num(c.threshold) };
}

/** A finished run's result as a response may show it: nothing about fewer than k employees. */
export function toResultView(
  stored: StoredResult,
  k: number,
  actions: Record<string, string>,
): ModelResultView {
  const evaluation = stored.crossValidation?.pooled ?? stored.inSample;
  if (!evaluation) throw new Error('A finished run has an evaluation');
  const tree = withholdSmallNodes(stored.tree, k);
  const decileSize = stored.trainingRows / 10;
  return {
    rowCount: stored.rowCount,
    positive: stored.positive,
    baseRate: num(stored.baseRate),
    metrics: headline(evaluation.metrics),
    metricsSource: stored.crossValidation ? 'cross-validation' : 'training',
    crossValidation: stored.crossValidation
      ? {
          folds: stored.crossValidation.folds,
          metrics: Object.fromEntries(
            (Object.keys(headline(evaluation.metrics)) as (keyof HeadlineMetrics)[]).map((key) => [
              key,
              {
                mean: num(stored.crossValidation?.metrics[key]?.mean),
                sd: num(stored.crossValidation?.metrics[key]?.sd),
              } satisfies Spread,
            ]),
          ) as Record<keyof HeadlineMetrics, Spread>,
        }
      : null,
    roc: coarsenRoc(evaluation, k),
    calibration: evaluation.calibration.map((bin) =>
      bin.n > 0 && bin.n < k
        ? { withheld: true as const }
        : {
            decile: bin.decile,
            n: bin.n,
            meanPredicted: num(bin.meanPredicted),
            observedRate: num(bin.observedRate),
          },
    ),
    gains: decileSize >= k ? evaluation.gains.map((g) => ({ ...g, lift: num(g.lift) })) : [],
    confusion: withholdConfusion(evaluation, k),
    pruning: {
      alpha: num(stored.pruning.alpha),
      rule: stored.pruning.rule,
      leaves: countLeaves(stored.tree),
    },
    tree,
    segments: withholdSegments(stored.segments, tree, k),
    drivers: buildDrivers(stored, k, actions),
  };
}

export function countLeaves(tree: TreeNode): number {
  if (isWithheld(tree)) return 0;
  return isInternal(tree) ? countLeaves(tree.children[0]) + countLeaves(tree.children[1]) : 1;
}
