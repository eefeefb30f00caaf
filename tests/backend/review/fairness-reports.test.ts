import { describe, expect, it } from 'vitest';
import type { DatasetColumnsForEngine } from '../../../backend/src/modules/datasets/engine-columns';
import { fairnessReports } from '../../../backend/src/modules/review/fairness.service';

// Invented rows: 30 employees with a blocked sex column and a date of birth the engine turned into age.
const n = 30;
const columns: DatasetColumnsForEngine = {
  datasetId: 'd',
  rowCount: n,
  labels: Array.from({ length: n }, (_, i) => (i % 3 === 0 ? 1 : 0)),
  features: [
    {
      name: 'Sex',
      kind: 'categorical',
      values: Array.from({ length: n }, (_, i) => (i < 27 ? (i % 2 ? 'F' : 'M') : 'X')),
      protectedCharacteristic: 'sex',
    },
    {
      name: 'Age (years)',
      kind: 'numeric',
      values: Array.from({ length: n }, (_, i) => 20 + i),
      protectedCharacteristic: 'age',
      derivedFrom: 'Date of Birth',
    },
    {
      name: 'Weekly Overtime Hours',
      kind: 'numeric',
      values: Array(n).fill(3),
      protectedCharacteristic: null,
    },
  ],
  teams: Array(n).fill('A'),
  departments: null,
  managerEmails: null,
  employeeKeys: Array.from({ length: n }, (_, i) => `k${i}`),
};

describe('fairness reports of a model run', () => {
  it('gives one report per blocked field present, grouping a blocked date of birth by age in quantile bins', () => {
    const reports = fairnessReports(columns, Array(n).fill(0.3), {
      k: 5,
      blockedFields: ['Sex', 'Date of Birth', 'Religion'],
    });
    expect(reports.map((r) => r.field)).toEqual(['Sex', 'Date of Birth']);
    expect(reports[1]!.bins).toBe(5);
    expect(reports[1]!.groups).toHaveLength(5);
  });

  it('withholds a group smaller than k (and one more, so the total does not reveal it)', () => {
    const [sex] = fairnessReports(columns, Array(n).fill(0.3), { k: 5, blockedFields: ['Sex'] });
    const withheld = sex!.groups.filter((g) => g.withheld).map((g) => g.group);
    expect(withheld).toContain('X');
    expect(withheld.length).toBeGreaterThanOrEqual(2);
  });

  it('refuses predictions that do not match the rows', () => {
    expect(() => fairnessReports(columns, [0.1], { k: 5, blockedFields: ['Sex'] })).toThrow(
      /expected 30 predictions/,
    );
  });
});
