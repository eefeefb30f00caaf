import { seededRandom } from '../../../backend/src/modeling/split-rows.js';
import { buildTable, type Table } from '../../../backend/src/modeling/table.js';

/**
 * A small invented staff table for tests: leaving rises with overtime, short tenure and one
 * region; "Age band" is the most predictive column of all, so tests can show it stays blocked.
 */
export function staffTable(rowCount: number, seed = 7): { table: Table; label: number[] } {
  const random = seededRandom(seed);
  const overtime: (number | null)[] = [];
  const tenure: number[] = [];
  const region: (string | null)[] = [];
  const ageBand: string[] = [];
  const label: number[] = [];
  const regions = ['North', 'East', 'South', 'West'];
  for (let i = 0; i < rowCount; i++) {
    const ot = Math.round(random() * 200) / 10;
    const t = Math.floor(random() * 120);
    const r = regions[Math.floor(random() * 4)];
    const young = random() < 0.1;
    const p = 0.05 + (ot > 10.5 ? 0.3 : 0) + (t <= 14 ? 0.4 : 0) + (r === 'East' ? 0.15 : 0);
    const leaves = young ? random() < 0.95 : random() < p;
    overtime.push(random() < 0.1 ? null : ot);
    tenure.push(t);
    region.push(random() < 0.05 ? null : r);
    ageBand.push(young ? 'under 25' : '25 and over');
    label.push(leaves ? 1 : 0);
  }
  const table = buildTable([
    { name: 'Weekly overtime', kind: 'numeric', values: overtime },
    { name: 'Tenure', kind: 'numeric', values: tenure },
    { name: 'Region', kind: 'categorical', values: region },
    { name: 'Age band', kind: 'categorical', values: ageBand },
  ]);
  return { table, label };
}

export const allowed = ['Weekly overtime', 'Tenure', 'Region'];
