import { seededRandom } from '../backend/src/modeling/split-rows.js';
import { buildTable, type ColumnInput, type Table } from '../backend/src/modeling/table.js';

/** An invented staff table (benchmark data only): 22 numeric and 8 categorical columns, 3–15% missing in some. */
export function syntheticStaff(rows: number, seed: number): { table: Table; label: Uint8Array } {
  const random = seededRandom(seed);
  const normal = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const numeric: Float64Array[] = Array.from({ length: 22 }, () => new Float64Array(rows));
  const levelsOf = [3, 4, 5, 6, 8, 12, 20, 40];
  const codes = levelsOf.map(() => new Int32Array(rows));
  const label = new Uint8Array(rows);
  const levelEffect = levelsOf.map((count) => Array.from({ length: count }, () => normal() * 0.4));
  for (let r = 0; r < rows; r++) {
    for (let j = 0; j < 22; j++) numeric[j][r] = normal();
    // a few columns look like counts and scales (few distinct values), the rest are continuous
    numeric[0][r] = Math.max(0, Math.round(8 + 5 * numeric[0][r])); // overtime hours
    numeric[1][r] = Math.floor(random() * 240); // tenure months
    numeric[2][r] = Math.round(1 + random() * 4); // engagement score 1–5
    numeric[3][r] = Math.round(random() * 30); // training days
    for (let c = 0; c < levelsOf.length; c++) codes[c][r] = Math.floor(random() * levelsOf[c]);
    let logit =
      -1.8 +
      (numeric[0][r] > 10 ? 0.7 : 0) +
      (numeric[1][r] < 14 ? 0.8 : -0.004 * numeric[1][r]) -
      0.3 * (numeric[2][r] - 3) +
      0.35 * numeric[4][r] +
      0.25 * numeric[5][r] * (numeric[6][r] > 0 ? 1 : -1) +
      0.2 * Math.abs(numeric[7][r]);
    for (let c = 0; c < 4; c++) logit += levelEffect[c][codes[c][r]];
    label[r] = random() < 1 / (1 + Math.exp(-logit)) ? 1 : 0;
    for (let j = 0; j < 22; j++)
      if (j % 3 === 0 && random() < 0.03 + (j % 4) * 0.04) numeric[j][r] = Number.NaN;
    for (let c = 0; c < 8; c += 2) if (random() < 0.05) codes[c][r] = -1;
  }
  const columns: ColumnInput[] = [
    ...numeric.map((values, j) => ({ name: `n${j}`, kind: 'numeric' as const, values })),
    ...codes.map((c, k) => ({
      name: `c${k}`,
      kind: 'categorical' as const,
      values: Array.from(c, (code) => (code < 0 ? null : `L${code}`)),
    })),
  ];
  return { table: buildTable(columns), label };
}
