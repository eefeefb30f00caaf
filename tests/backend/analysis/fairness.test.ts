import { describe, expect, it } from 'vitest';
import { FOUR_FIFTHS_RULE, fairnessScreen } from '../../../backend/src/analysis/fairness';
import { WITHHELD } from '../../../backend/src/analysis/suppression';

/** Builds employee rows: for each group, `headcount` employees of whom `leavers` left. */
function employees(groups: Record<string, { headcount: number; leavers: number; risk?: number }>) {
  const values: string[] = [];
  const left: boolean[] = [];
  const predicted: number[] = [];
  for (const [group, { headcount, leavers, risk = 0.2 }] of Object.entries(groups)) {
    for (let i = 0; i < headcount; i++) {
      values.push(group);
      left.push(i < leavers);
      predicted.push(risk);
    }
  }
  return { values, left, predicted };
}

describe('fairness screen', () => {
  it('flags only the group retained at under four fifths of the best-retained group (Uniform Guidelines example)', () => {
    // Uniform Guidelines on Employee Selection Procedures, Questions and Answers (1979; Federal
    // Register citation from memory): rates 60%, 45%, 48%, 51% → ratios 0.75, 0.80, 0.85; adverse
    // impact only for 0.75, exactly 0.80 is not. Here the rates are retention rates.
    const report = fairnessScreen({
      field: 'Ethnicity',
      ...employees({
        A: { headcount: 100, leavers: 40 },
        B: { headcount: 100, leavers: 55 },
        C: { headcount: 100, leavers: 52 },
        D: { headcount: 100, leavers: 49 },
      }),
      k: 5,
    });
    expect(report.rule).toBe(FOUR_FIFTHS_RULE);
    const byGroup = Object.fromEntries(report.groups.map((g) => [g.group, g]));
    expect(byGroup.A).toMatchObject({ reference: true, retentionRate: 0.6, flagged: false });
    expect(byGroup.B!.retentionRatio).toBeCloseTo(0.75, 10);
    expect(byGroup.C!.retentionRatio).toBeCloseTo(0.8, 10);
    expect(byGroup.D!.retentionRatio).toBeCloseTo(0.85, 10);
    expect(report.groups.filter((g) => g.flagged).map((g) => g.group)).toEqual(['B']);
  });

  it('gives headcount, attrition rate and mean predicted risk per group', () => {
    const report = fairnessScreen({
      field: 'Sex',
      ...employees({
        F: { headcount: 20, leavers: 5, risk: 0.3 },
        M: { headcount: 10, leavers: 1, risk: 0.1 },
      }),
      k: 5,
    });
    expect(report.groups[0]).toMatchObject({ group: 'F', headcount: 20, leavers: 5, attritionRate: 0.25 });
    expect(report.groups[0]!.meanPredictedRisk).toBeCloseTo(0.3, 10);
    expect(report.groups[1]).toMatchObject({ group: 'M', headcount: 10, reference: true });
  });

  it('withholds a group smaller than k, and one more so the total does not give it away', () => {
    const report = fairnessScreen({
      field: 'Disability',
      ...employees({
        No: { headcount: 40, leavers: 8 },
        Yes: { headcount: 7, leavers: 2 },
        Declined: { headcount: 3, leavers: 1 },
      }),
      k: 5,
    });
    const withheld = report.groups.filter((g) => g.withheld);
    expect(withheld.map((g) => g.group).sort()).toEqual(['Declined', 'Yes']);
    expect(withheld[0]).toMatchObject({
      headcount: WITHHELD,
      attritionRate: WITHHELD,
      meanPredictedRisk: WITHHELD,
    });
    expect(report.groups.find((g) => g.group === 'No')!.reference).toBe(true);
  });

  it('bins a date of birth into quantile groups and says how many', () => {
    const values = Array.from({ length: 50 }, (_, i) => `19${50 + i}-01-15`);
    const report = fairnessScreen({
      field: 'Date of Birth',
      values,
      left: values.map((_, i) => i % 4 === 0),
      predicted: values.map(() => 0.25),
      k: 5,
    });
    expect(report.bins).toBe(5);
    expect(report.groups).toHaveLength(5);
  });
});
