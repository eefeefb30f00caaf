// Intake benchmark: uploads generated exports (invented Quillfern data, 30 columns) to a Coppice
// server running as a process of its own (as `npm run serve` does), and prints per upload the
// time until the dataset is profiled and stored (with the server's read/store split from its log),
// the server's CPU seconds for it, the time to map it, and the server's peak resident memory.
//   npm run bench:intake                  10k and 100k rows, CSV and XLSX
//   npm run bench:intake -- --rows 10000 --formats csv   only some sizes and formats
// Goals: 100k-row XLSX profiled and stored in under 20 s, CSV under 8 s, server peak under 1 GB.
// The machine is shared: CPU seconds and the load average are printed beside the wall times.
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import request from 'supertest';
import {
  generateQuillfernExport,
  QUILLFERN_MAPPING,
  type QuillfernExport,
} from '../backend/src/demo/quillfern';
import { quillfernCsv } from '../backend/src/demo/quillfern-csv';
import { quillfernXlsx } from '../backend/src/demo/quillfern-xlsx';
import { spawnOnOwnCluster } from '../tests/helpers/own-cluster';
import { signInAcross } from '../tests/helpers/processes';

const { values } = parseArgs({
  options: {
    rows: { type: 'string', default: '10000,100000' },
    formats: { type: 'string', default: 'csv,xlsx' },
    repeats: { type: 'string', default: '1' },
  },
});
const formats = (values.formats ?? '')
  .split(',')
  .filter((f): f is 'csv' | 'xlsx' => f === 'csv' || f === 'xlsx');
const sizes = (values.rows ?? '')
  .split(',')
  .map(Number)
  .filter((n) => n > 0);
const repeats = Math.max(1, Number(values.repeats) || 1);

function withThirtyColumns(data: QuillfernExport): QuillfernExport {
  const extra = ['Bench Filler A', 'Bench Filler B', 'Bench Filler C'];
  return {
    ...data,
    header: [...data.header, ...extra] as QuillfernExport['header'],
    rows: data.rows.map((row, i) => [...row, (i * 7) % 13, ((i * 11) % 17) / 2, (i * 3) % 5]),
  };
}

// Writing a 100k-row workbook takes about 20 s; the generator is seeded, so the file is kept.
const CACHE = path.join(os.tmpdir(), 'coppice-bench-intake-cache');
function exportBytes(data: QuillfernExport, rows: number, format: 'csv' | 'xlsx'): Buffer {
  if (format === 'csv') return Buffer.from(quillfernCsv(data), 'utf8');
  const file = path.join(CACHE, `quillfern-30col-seed1-${rows}.xlsx`);
  if (existsSync(file)) return readFileSync(file);
  const bytes = Buffer.from(quillfernXlsx(data));
  mkdirSync(CACHE, { recursive: true });
  writeFileSync(`${file}.part`, bytes);
  renameSync(`${file}.part`, file);
  return bytes;
}

// Linux /proc: the server's peak resident set (VmHWM, reset by writing 5 to clear_refs) and its
// CPU time (utime + stime of all its threads, in clock ticks of 1/100 s).
function peakRssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Math.round(Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024);
}
function residentMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Math.round(Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024);
}
function resetPeak(pid: number): void {
  try {
    writeFileSync(`/proc/${pid}/clear_refs`, '5');
  } catch {
    // without the right to do so, the peak is the server's peak so far
  }
}
function cpuSeconds(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

/** The server's own read/store split for one dataset, from its "dataset stored" log line. */
function phases(output: string, datasetId: string): { read: number; store: number } | null {
  for (const line of output.split('\n')) {
    if (!line.includes(datasetId) || !line.includes('dataset stored')) continue;
    try {
      const ms = JSON.parse(line).ms as { read: number; store: number };
      return { read: ms.read / 1000, store: ms.store / 1000 };
    } catch {
      return null;
    }
  }
  return null;
}

const load = () =>
  os
    .loadavg()
    .map((n) => n.toFixed(2))
    .join(' ');

const { url, server, stop } = await spawnOnOwnCluster('bench', { LOG_LEVEL: 'info' });
const pid = server.child.pid ?? 0;
try {
  const { cookie } = await signInAcross(url, url, 'analyst@quillfern.example');
  console.log(
    `Node ${process.version}, ${os.cpus().length} cores; load average at start ${load()}; server resident at start ${residentMb(pid)} MB`,
  );
  console.log(
    'rows     format  size MB  profiled+stored s (read + store)  server CPU s  mapped s  server peak MB  load (1 5 15 min)',
  );
  for (const rows of sizes) {
    const data = withThirtyColumns(generateQuillfernExport({ rows, seed: 1 }));
    for (const format of formats) {
      const bytes = exportBytes(data, rows, format);
      for (let repeat = 0; repeat < repeats; repeat += 1) {
        resetPeak(pid);
        const cpu = cpuSeconds(pid);
        const started = performance.now();
        const created = await request(url)
          .post('/api/datasets')
          .set('cookie', cookie)
          .attach('file', bytes, `bench.${format}`);
        const profiled = performance.now();
        const cpuUsed = cpuSeconds(pid) - cpu;
        if (created.status !== 201)
          throw new Error(`upload answered ${created.status}: ${created.text.slice(0, 300)}`);
        const mapped = await request(url)
          .put(`/api/datasets/${created.body.id}/mapping`)
          .set('cookie', cookie)
          .send(QUILLFERN_MAPPING);
        const done = performance.now();
        if (mapped.status !== 200)
          throw new Error(`mapping answered ${mapped.status}: ${mapped.text.slice(0, 300)}`);
        const peak = peakRssMb(pid);
        const split = phases(server.output(), created.body.id);
        const splitText = split ? `(${split.read.toFixed(1)} + ${split.store.toFixed(1)})` : '';
        console.log(
          `${String(rows).padEnd(8)} ${format.padEnd(6)} ${(bytes.length / 1024 / 1024).toFixed(1).padStart(8)}  ${((profiled - started) / 1000).toFixed(1).padStart(5)} ${splitText.padEnd(13)}  ${cpuUsed.toFixed(1).padStart(12)}  ${((done - profiled) / 1000).toFixed(1).padStart(8)}  ${String(peak).padStart(14)}  ${load()}`,
        );
        await request(url).delete(`/api/datasets/${created.body.id}`).set('cookie', cookie);
      }
    }
  }
} finally {
  await stop();
}
