/**
 * Benchmark of the team brief endpoints (not a test): `npm run bench:api`. Starts a throw-away
 * PostgreSQL and the built Coppice server in a process of its own on loopback, publishes the briefs of the invented demo export through
 * the API (approval, a model run, publication request, publishing), then
 * loads `GET /api/teams/:id/brief` and `GET /api/teams` as manager.north with autocannon (in a
 * child process, so that load and server do not share an event loop): 50 connections for 20 s
 * each, bounded. Prints requests/s, p50/p95/p99 latency and errors. Goal on a 2-core machine:
 * p99 under 50 ms and no errors.
 */
import { execFile } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import autocannon from 'autocannon';
import request from 'supertest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../backend/src/demo/quillfern.js';
import { quillfernCsv } from '../backend/src/demo/quillfern-csv.js';
import type { TeamSummary } from '../shared/briefs.js';
import { spawnOnOwnCluster } from '../tests/helpers/own-cluster.js';
import { signInAcross } from '../tests/helpers/processes.js';
import { publishDatasetBriefs } from './publish-demo.js';

const CONNECTIONS = 50;
const SECONDS = Number(process.env.BENCH_SECONDS ?? 20);

type LoadResult = {
  requestsPerSecond: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
  non2xx: number;
};

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

/** Child mode: load one URL and print the result as JSON. */
async function load(url: string, cookie: string): Promise<void> {
  const times: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      { url, connections: CONNECTIONS, duration: SECONDS, headers: { cookie, accept: 'application/json' } },
      (error, finished) => (error ? reject(error) : resolve(finished)),
    );
    instance.on('response', (_client, _status, _bytes, time) => times.push(time));
  });
  times.sort((a, b) => a - b);
  const out: LoadResult = {
    requestsPerSecond: result.requests.average,
    p50: percentile(times, 50),
    p95: percentile(times, 95),
    p99: percentile(times, 99),
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
  };
  process.stdout.write(`${JSON.stringify(out)}\n`);
}

/** CPU seconds (user + system) used so far by the PostgreSQL server whose postmaster is `postmaster`. */
function postgresCpuSeconds(postmaster: number): number {
  const ticks = 100; // USER_HZ on Linux
  let total = 0;
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const fields = readFileSync(`/proc/${entry}/stat`, 'utf8').split(') ')[1]!.split(' ');
      const pid = Number(entry);
      if (pid === postmaster || Number(fields[1]) === postmaster)
        total += (Number(fields[11]) + Number(fields[12])) / ticks;
    } catch {
      // the process ended meanwhile
    }
  }
  return total;
}

/** CPU seconds (user + system, all threads) used so far by process `pid`. */
function processCpuSeconds(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

/** Runs the load generator in a child process against `url`; its result. */
async function loadFrom(url: string, cookie: string, seconds = SECONDS): Promise<LoadResult> {
  const child = await promisify(execFile)(
    process.execPath,
    ['--import', 'tsx', fileURLToPath(import.meta.url), '--load', url, cookie],
    {
      encoding: 'utf8',
      timeout: (seconds + 60) * 1000,
      env: { ...process.env, BENCH_SECONDS: String(seconds) },
    },
  );
  return JSON.parse(child.stdout.trim().split('\n').at(-1)!) as LoadResult;
}

async function main(): Promise<void> {
  // The built server in a process of its own, as production runs it (identity provider and mail
  // sink outside it), on a PostgreSQL cluster of its own.
  const { url, server, dataDir, stop } = await spawnOnOwnCluster('bench-api');
  const pid = server.child.pid ?? 0;
  try {
    const analyst = (await signInAcross(url, url, 'analyst@quillfern.example')).cookie;
    const privacy = (await signInAcross(url, url, 'privacy@quillfern.example')).cookie;
    const upload = await request(url)
      .post('/api/datasets')
      .set('cookie', analyst)
      .attach(
        'file',
        Buffer.from(quillfernCsv(generateQuillfernExport({ rows: 2400 })), 'utf8'),
        'quillfern.csv',
      );
    if (upload.status !== 201)
      throw new Error(`upload answered ${upload.status}: ${upload.text.slice(0, 300)}`);
    const datasetId = upload.body.id as string;
    await request(url)
      .put(`/api/datasets/${datasetId}/mapping`)
      .set('cookie', analyst)
      .send(QUILLFERN_MAPPING);
    await publishDatasetBriefs(url, { analyst, privacy }, datasetId);
    const north = (await signInAcross(url, url, 'manager.north@quillfern.example')).cookie;
    const teams = (await request(url).get('/api/teams').set('cookie', north)).body as TeamSummary[];
    const team = teams.find((t) => !t.withheld)!;
    const targets = [
      ['GET /api/teams/:id/brief', `${url}/api/teams/${team.id}/brief`],
      ['GET /api/teams', `${url}/api/teams`],
    ] as const;
    console.log(
      `Node ${process.version}, ${os.cpus().length} cores; load average at start ${os
        .loadavg()
        .map((n) => n.toFixed(2))
        .join(' ')}; ${CONNECTIONS} connections, ${SECONDS} s per endpoint`,
    );
    // Warm-up, not measured: 8 s of the same load on the brief, so that compilation, the
    // publishing e-mails and PostgreSQL's first visits to the new tables are not in the figures.
    await loadFrom(targets[0][1], north, 8);
    const postmaster = Number(readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0]);
    for (const [name, target] of targets) {
      const appBefore = processCpuSeconds(pid);
      const pgBefore = postgresCpuSeconds(postmaster);
      const r = await loadFrom(target, north);
      const requests = r.requestsPerSecond * SECONDS;
      // CPU per request shows the cost even when other work shares the machine.
      const appMs = (((processCpuSeconds(pid) - appBefore) * 1000) / requests).toFixed(2);
      const pgMs = (((postgresCpuSeconds(postmaster) - pgBefore) * 1000) / requests).toFixed(2);
      const verdict =
        r.requestsPerSecond > 0 && r.p99 < 50 && r.errors === 0 && r.non2xx === 0
          ? 'meets the goal'
          : 'MISSES the goal';
      console.log(
        `${name.padEnd(26)} ${r.requestsPerSecond.toFixed(0).padStart(6)} req/s  p50 ${r.p50.toFixed(1)} ms  p95 ${r.p95.toFixed(1)} ms  p99 ${r.p99.toFixed(1)} ms  errors ${r.errors}  non-2xx ${r.non2xx}  CPU/request: app ${appMs} ms, PostgreSQL ${pgMs} ms  (${verdict}: p99 < 50 ms, no errors)`,
      );
    }
  } finally {
    await stop();
  }
}

if (process.argv[2] === '--load') {
  await load(process.argv[3]!, process.argv[4]!);
} else {
  await main();
}
