import type { Split } from '../../../../shared/tree';

/** One step on the path from the root: the split taken and which side of it. */
export type RuleStep = { split: Split; side: 'left' | 'right' };

export type SegmentRuleOptions = {
  /** say where employees with a missing value went (default true) */
  mentionMissing?: boolean;
  /** turns a column name into words shown to people (default: as is) */
  featureLabel?: (feature: string) => string;
};

export function formatThreshold(value: number): string {
  return value.toLocaleString('en-GB', { maximumFractionDigits: 3, useGrouping: false });
}

export function listWords(items: readonly string[], conjunction: 'or' | 'nor' = 'or'): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} ${conjunction} ${items[items.length - 1]}`;
}

function includesMissing(step: RuleStep): boolean {
  return step.split.missingGoesLeft === (step.side === 'left');
}

function categoricalClause(step: RuleStep, label: string): string {
  const categories = step.split.categories ?? [];
  if (step.side === 'left') return `${label} is ${listWords(categories)}`;
  if (categories.length === 1) return `${label} is not ${categories[0]}`;
  return `${label} is neither ${listWords(categories, 'nor')}`;
}

/**
 * A segment in plain words, e.g. "Weekly Overtime Hours above 10.5 and Region is North or East".
 * Repeated numeric splits on one feature merge into one clause ("Tenure above 2 and at most 5").
 */
export function segmentRule(steps: readonly RuleStep[], options: SegmentRuleOptions = {}): string {
  const { mentionMissing = true, featureLabel = (f: string) => f } = options;
  if (steps.length === 0) return 'All employees';

  type NumericBounds = { above?: number; atMost?: number; missing: boolean };
  const order: string[] = [];
  const numeric = new Map<string, NumericBounds>();
  const clauses = new Map<string, string>();

  steps.forEach((step, index) => {
    const { split } = step;
    if (split.kind === 'numeric' && split.threshold !== undefined) {
      const key = `numeric:${split.feature}`;
      const bounds = numeric.get(key) ?? { missing: true };
      if (!numeric.has(key)) order.push(key);
      if (step.side === 'left') bounds.atMost = Math.min(bounds.atMost ?? Infinity, split.threshold);
      else bounds.above = Math.max(bounds.above ?? -Infinity, split.threshold);
      bounds.missing = bounds.missing && includesMissing(step);
      numeric.set(key, bounds);
    } else {
      const key = `step:${index}`;
      order.push(key);
      const missing = mentionMissing && includesMissing(step) ? ' (or missing)' : '';
      clauses.set(key, categoricalClause(step, featureLabel(split.feature)) + missing);
    }
  });

  return order
    .map((key) => {
      const bounds = numeric.get(key);
      if (!bounds) return clauses.get(key)!;
      const label = featureLabel(key.slice('numeric:'.length));
      const parts: string[] = [];
      if (bounds.above !== undefined) parts.push(`above ${formatThreshold(bounds.above)}`);
      if (bounds.atMost !== undefined) parts.push(`at most ${formatThreshold(bounds.atMost)}`);
      const missing = mentionMissing && bounds.missing ? ' (or missing)' : '';
      return `${label} ${parts.join(' and ')}${missing}`;
    })
    .join(' and ');
}

/** The short text on the edge into a child: "at most 10.5", "above 10.5", "North or East", "other values". */
export function edgeLabel(step: RuleStep): string {
  const { split, side } = step;
  if (split.kind === 'numeric' && split.threshold !== undefined) {
    return `${side === 'left' ? 'at most' : 'above'} ${formatThreshold(split.threshold)}`;
  }
  if (side === 'right') return 'other values';
  const categories = split.categories ?? [];
  const text = listWords(categories);
  return text.length > 28 ? `${categories.length} values` : text;
}
