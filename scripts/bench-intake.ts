// Intake benchmark: uploads generated exports (invented Quillfern data, 30 columns) through the API
// and prints the time until the dataset is profiled and stored, the time to map it, and the peak
// resident memory of the process (server and client share it here; the client holds one file).
//   npm run bench:intake                  10k and 100k rows, CSV and XLSX
//   npm run bench:intake -- --rows 10000 --formats csv   only some sizes and formats
// Goals: 100k-row XLSX profiled and stored in under 20 s, CSV under 8 s, peak under 1 GB.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import {
  generateQuillfernExport,
  QUILLFERN_MAPPING,
  type QuillfernExport,
} from '../backend/src/demo/quillfern';
import { quillfernCsv } from '../backend/src/demo/quillfern-csv';
import { quillfernXlsx } from '../backend/src/demo/quillfern-xlsx';
import { loadConfig } from '../backend/src/lib/config';
import { startCoppice } from '../backend/src/runtime';
import { signInAgent } from '../tests/helpers/sign-in';
import {
  ensureDatabase,
  ensurePostgres,
  freePort,
  initCluster,
  removeCluster,
  startCluster,
  // @ts-expect-error: plain JavaScript helpers shared with the npm scripts
} from './lib/pg.mjs';

const { values } = parseArgs({
  options: {
    rows: { type: 'string', default: '10000,100000' },
    formats: { type: 'string', default: 'csv,xlsx' },
  },
});
const formats = (values.formats ?? '')
  .split(',')
  .filter((f): f is 'csv' | 'xlsx' => f === 'csv' || f === 'xlsx');
const sizes = (values.rows ?? '')
  .split(',')
  .map(Number)
  .filter((n) => n > 0);

function withThirtyColumns(data: QuillfernExport): QuillfernExport {
  const extra = ['Bench Filler A', 'Bench Filler B', 'Bench Filler C'];
  return {
    ...data,
    header: [...data.header, ...extra] as QuillfernExport['header'],
    rows: data.rows.map((row, i) => [...row, (i * 7) % 13, ((i * 11) % 17) / 2, (i * 3) % 5]),
  };
}

function peakRssMb(): number {
  const status = readFileSync('/proc/self/status', 'utf8');
  return Math.round(Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024);
}

function resetPeak(): void {
  (globalThis as { gc?: () => void }).gc?.();
  try {
    writeFileSync('/proc/self/clear_refs', '5'); // Linux: resets the peak resident set size
  } catch {
    // without it, the peak is the process's peak so far
  }
}

const bin = ensurePostgres();
const dir = mkdtempSync(path.join(os.tmpdir(), 'coppice-bench-'));
const pgPort = await freePort();
initCluster(bin, path.join(dir, 'pg'));
startCluster(bin, path.join(dir, 'pg'), pgPort, { fast: true });
ensureDatabase(bin, pgPort, 'coppice');
const config = loadConfig({
  NODE_ENV: 'test',
  DATABASE_URL: `postgres://coppice@127.0.0.1:${pgPort}/coppice`,
  PORT: String(await freePort()),
  IDP_PORT: String(await freePort()),
  SMTP_PORT: String(await freePort()),
  DATA_DIR: path.join(dir, 'data'),
  LOG_LEVEL: 'warn',
});
const running = await startCoppice(config, { migrate: true, listen: true });
try {
  const agent = await signInAgent(running, 'analyst@quillfern.example', config.localIdp?.demoPassword ?? '');
  // CPU seconds (all threads of the process) show the cost when the machine is shared.
  console.log('rows     format  size MB  profiled+stored s  (CPU s)  mapped s  peak RSS MB');
  for (const rows of sizes) {
    const data = withThirtyColumns(generateQuillfernExport({ rows, seed: 1 }));
    for (const format of formats) {
      const bytes =
        format === 'csv' ? Buffer.from(quillfernCsv(data), 'utf8') : Buffer.from(quillfernXlsx(data));
      resetPeak();
      const cpu = process.cpuUsage();
      const started = performance.now();
      const created = await agent.post('/api/datasets').attach('file', bytes, `bench.${format}`);
      const profiled = performance.now();
      const cpuSeconds = (process.cpuUsage(cpu).user + process.cpuUsage(cpu).system) / 1e6;
      if (created.status !== 201)
        throw new Error(`upload answered ${created.status}: ${created.text.slice(0, 300)}`);
      const mapped = await agent.put(`/api/datasets/${created.body.id}/mapping`).send(QUILLFERN_MAPPING);
      const done = performance.now();
      if (mapped.status !== 200)
        throw new Error(`mapping answered ${mapped.status}: ${mapped.text.slice(0, 300)}`);
      console.log(
        `${String(rows).padEnd(8)} ${format.padEnd(6)} ${(bytes.length / 1024 / 1024).toFixed(1).padStart(8)}  ${((profiled - started) / 1000).toFixed(1).padStart(17)}  ${cpuSeconds.toFixed(1).padStart(7)}  ${((done - profiled) / 1000).toFixed(1).padStart(8)}  ${String(peakRssMb()).padStart(11)}`,
      );
      await agent.delete(`/api/datasets/${created.body.id}`);
    }
  }
} finally {
  await running.stop();
  removeCluster(bin, path.join(dir, 'pg'));
}
