// Writes the invented Quillfern Community Care export for a manual upload:
//   npm run demo:data -- --rows 2400 --out quillfern.xlsx --seed 7
import { writeFileSync } from 'node:fs';
import { parseArgs } from 'node:util';
import { generateQuillfernExport, QUILLFERN_NOTE } from './quillfern';
import { quillfernCsv } from './quillfern-csv';
import { quillfernXlsx } from './quillfern-xlsx';

const { values } = parseArgs({
  options: {
    rows: { type: 'string', default: '2400' },
    out: { type: 'string', default: 'quillfern-demo.xlsx' },
    seed: { type: 'string', default: '20251001' },
  },
});
const rows = Number(values.rows);
const seed = Number(values.seed);
const out = values.out ?? 'quillfern-demo.xlsx';
if (!Number.isInteger(rows) || rows < 20 || !Number.isInteger(seed)) {
  console.error('Usage: npm run demo:data -- --rows N (at least 20) --out FILE.xlsx|FILE.csv --seed N');
  process.exit(1);
}
if (!/\.(xlsx|csv)$/i.test(out)) {
  console.error('The output file must end in .xlsx or .csv');
  process.exit(1);
}
const data = generateQuillfernExport({ rows, seed });
const bytes = out.toLowerCase().endsWith('.csv')
  ? Buffer.from(quillfernCsv(data), 'utf8')
  : quillfernXlsx(data);
writeFileSync(out, bytes);
console.log(`Wrote ${data.rows.length} rows to ${out}.`);
console.log(QUILLFERN_NOTE);
