import { describe, expect, it } from 'vitest';
import {
  chiSquare,
  contingencyTable,
  cramersV,
  MISSING_LEVEL,
  mutualInformation,
  normalisedMutualInformation,
  proxyReport,
  toLevels,
} from '../../../backend/src/analysis/association';

// PlayTennis, Quinlan (1986) Table 1 / Mitchell (1997) Table 3.2, days D1–D14.
const outlook =
  'Sunny Sunny Overcast Rain Rain Rain Overcast Sunny Sunny Rain Sunny Overcast Overcast Rain'.split(' ');
const play = 'No No Yes Yes Yes No Yes No Yes Yes Yes Yes Yes No'.split(' ');

describe('association between two columns', () => {
  it("matches scipy's `association` docstring example for Cramér's V", () => {
    // scipy.stats.contingency.association docstring: this table gives V = 0.18617813077483678.
    expect(
      cramersV([
        [100, 150],
        [203, 322],
        [420, 700],
        [320, 210],
      ]),
    ).toBeCloseTo(0.186178, 6);
  });

  it("matches scipy's `chi2_contingency` docstring example for χ², degrees of freedom and expected counts", () => {
    // scipy.stats.chi2_contingency docstring: [[10,10,20],[20,20,20]] → χ² 2.7778, dof 2.
    const result = chiSquare([
      [10, 10, 20],
      [20, 20, 20],
    ]);
    expect(result.chiSquare).toBeCloseTo(2.7778, 4);
    expect(result.dof).toBe(2);
    expect(result.expected).toEqual([
      [12, 12, 16],
      [18, 18, 24],
    ]);
  });

  it('gives the mutual information of Outlook and Play in the PlayTennis data', () => {
    const table = contingencyTable(toLevels(outlook), toLevels(play));
    // CHECKS.md: information gain of Outlook = MI(Outlook; Play) = 0.246750 bits (Quinlan 1986, exact value).
    expect(mutualInformation(table)).toBeCloseTo(0.24675, 6);
    // Arithmetic from the same table: H(Outlook) = 1.577406, H(Play) = 0.940286,
    // so NMI = 0.246750 / ((1.577406 + 0.940286) / 2) = 0.196013.
    expect(normalisedMutualInformation(table)).toBeCloseTo(0.196013, 5);
  });

  it('reads a column against itself as perfectly associated, and a constant column as not at all', () => {
    const levels = toLevels(outlook);
    expect(cramersV(contingencyTable(levels, levels))).toBeCloseTo(1, 10);
    expect(normalisedMutualInformation(contingencyTable(levels, levels))).toBeCloseTo(1, 10);
    const constant = toLevels(outlook.map(() => 'same'));
    expect(cramersV(contingencyTable(levels, constant))).toBe(0);
    expect(normalisedMutualInformation(contingencyTable(levels, constant))).toBe(0);
  });
});

describe('turning columns into levels', () => {
  it('cuts numbers into 5 quantile bins and keeps missing values as their own level', () => {
    const values = [...Array.from({ length: 100 }, (_, i) => i + 1), null, null];
    const levels = toLevels(values);
    expect(levels.kind).toBe('numeric');
    expect(levels.bins).toBe(5);
    expect(levels.labels).toHaveLength(6);
    expect(levels.labels).toContain(MISSING_LEVEL);
    const perLevel = levels.labels.map((_, code) => levels.codes.filter((c) => c === code).length);
    expect(perLevel).toEqual([20, 20, 20, 20, 20, 2]);
  });

  it('reads ISO dates as dates and bins them the same way', () => {
    const dates = Array.from({ length: 10 }, (_, i) => `19${60 + i * 3}-06-01`);
    const levels = toLevels(dates, { bins: 2 });
    expect(levels.kind).toBe('date');
    expect(levels.labels).toHaveLength(2);
    expect(levels.labels[0]).toMatch(/^up to 19\d\d-\d\d-\d\d$/);
  });

  it('merges tied cut points, so a yes/no number gets two levels, not five', () => {
    const levels = toLevels([0, 0, 0, 1, 1, 0, 1, 0]);
    expect(levels.labels).toHaveLength(2);
  });
});

describe('proxyReport', () => {
  // Invented rows: "Years Since Qualification" follows age closely; "Depot" does not.
  const n = 200;
  const age = Array.from({ length: n }, (_, i) => 20 + (i % 45));
  const columns = {
    Age: age,
    'Years Since Qualification': age.map((a, i) => a - 21 + (i % 3)),
    Depot: Array.from({ length: n }, (_, i) => ['North', 'South', 'East', 'West'][i % 4]!),
    Sex: Array.from({ length: n }, (_, i) => (Math.floor(i / 7) % 2 === 0 ? 'F' : 'M')),
  };

  it('flags an allowed field that stands in for a blocked one and leaves an unrelated field alone', () => {
    const rows = proxyReport(columns, ['Years Since Qualification', 'Depot'], ['Age', 'Sex'], 0.5);
    expect(rows).toHaveLength(4);
    expect(rows[0]).toMatchObject({
      feature: 'Years Since Qualification',
      blockedField: 'Age',
      flagged: true,
    });
    expect(rows[0]!.featureBins).toBe(5);
    expect(rows.find((r) => r.feature === 'Depot' && r.blockedField === 'Age')!.flagged).toBe(false);
    expect(rows.filter((r) => r.flagged)).toHaveLength(1);
    for (let i = 1; i < rows.length; i++)
      expect(rows[i - 1]!.cramersV).toBeGreaterThanOrEqual(rows[i]!.cramersV);
  });

  it('flags a pair exactly at the threshold', () => {
    const [first] = proxyReport(columns, ['Years Since Qualification'], ['Age'], 1);
    const atThreshold = proxyReport(columns, ['Years Since Qualification'], ['Age'], first!.cramersV);
    expect(atThreshold[0]!.flagged).toBe(true);
  });

  it('never compares a blocked field with itself', () => {
    expect(proxyReport(columns, ['Age', 'Depot'], ['Age'], 0.5).map((r) => r.feature)).toEqual(['Depot']);
  });
});
