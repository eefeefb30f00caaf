// `npm run bench:load`: load on loopback against one Coppice app process (with its own throw-away
// PostgreSQL), bounded in time. Prints requests/s, latency percentiles and errors per scenario.
// BENCH_SECONDS (default 30) and BENCH_CONNECTIONS (default 200) shorten or lighten a run.
import os from 'node:os';
import autocannon from 'autocannon';
import request from 'supertest';
import { generateQuillfernExport } from '../backend/src/demo/quillfern';
import { quillfernCsv } from '../backend/src/demo/quillfern-csv';
import { spawnOnOwnCluster } from '../tests/helpers/own-cluster';
import { signInAcross } from '../tests/helpers/processes';
import { publishDatasetBriefs } from './publish-demo';

const SECONDS = Number(process.env.BENCH_SECONDS ?? 30);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 200);

type Figures = {
  scenario: string;
  rps: number;
  p50: number;
  p90: number;
  p95: number;
  p99: number;
  errors: number;
  non2xx: number;
};
const results: Figures[] = [];

async function hammer(
  scenario: string,
  url: string,
  cookie: string,
  connections = CONNECTIONS,
  seconds = SECONDS,
) {
  const result = await autocannon({ url, connections, duration: seconds, headers: { cookie } });
  const figures: Figures = {
    scenario,
    rps: Math.round(result.requests.average),
    p50: result.latency.p50,
    p90: result.latency.p90,
    p95: (result.latency as unknown as Record<string, number>).p97_5 ?? result.latency.p90,
    p99: result.latency.p99,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
  };
  results.push(figures);
  return figures;
}

async function main() {
  const { url, stop } = await spawnOnOwnCluster('bench', { AUTH_RATE_LIMIT: '10000' });
  try {
    const analyst = (await signInAcross(url, url, 'analyst@quillfern.example')).cookie;
    const manager = (await signInAcross(url, url, 'manager.north@quillfern.example')).cookie;

    const privacy = (await signInAcross(url, url, 'privacy@quillfern.example')).cookie;
    // The seeded demo dataset, published through the API as people do, gives the managers briefs.
    const datasets = await request(url).get('/api/datasets').set('cookie', analyst);
    log('publishing the demo briefs (approval, model run, publication) …');
    await publishDatasetBriefs(url, { analyst, privacy }, datasets.body[0].id);
    const teams = await request(url).get('/api/teams').set('cookie', manager);
    const team = (teams.body as { id: string; withheld: boolean }[]).find((t) => !t.withheld);
    if (!team) throw new Error('manager.north has no team with a brief');
    const heavyRead = {
      name: 'GET /api/teams/:id/brief (manager)',
      url: `${url}/api/teams/${team.id}/brief`,
      cookie: manager,
    };

    log(`${CONNECTIONS} connections for ${SECONDS} s on /api/me …`);
    await hammer('GET /api/me', `${url}/api/me`, manager);
    log(`${CONNECTIONS} connections for ${SECONDS} s on ${heavyRead.name} …`);
    await hammer(heavyRead.name, heavyRead.url, heavyRead.cookie);

    log('5 analysts upload 10,000-row exports at once while managers read …');
    const exports = [0, 1, 2, 3, 4].map((i) =>
      quillfernCsv(generateQuillfernExport({ rows: 10_000, seed: 100 + i })),
    );
    const reading = hammer(
      `${heavyRead.name} during uploads`,
      heavyRead.url,
      heavyRead.cookie,
      50,
      Math.min(SECONDS, 20),
    );
    const started = Date.now();
    const uploads = await Promise.all(
      exports.map(async (csv, i) => {
        const t0 = Date.now();
        const res = await request(url)
          .post('/api/datasets')
          .set('cookie', analyst)
          .field('name', `bench upload ${i}`)
          .attach('file', Buffer.from(csv), `bench-${i}.csv`);
        return {
          i,
          status: res.status,
          id: res.body.id as string,
          rowCount: res.body.rowCount,
          ms: Date.now() - t0,
        };
      }),
    );
    const uploadWall = Date.now() - started;
    await reading;
    let whole = 0;
    for (const u of uploads) {
      const detail = await request(url).get(`/api/datasets/${u.id}`).set('cookie', analyst);
      if (u.status === 201 && detail.body.name === `bench upload ${u.i}` && detail.body.rowCount === 10_000)
        whole++;
    }

    process.stdout.write(
      '\nscenario | requests/s | p50 ms | p90 ms | p97.5 ms | p99 ms | errors | non-2xx\n',
    );
    process.stdout.write('--- | --- | --- | --- | --- | --- | --- | ---\n');
    for (const r of results)
      process.stdout.write(
        `${r.scenario} | ${r.rps} | ${r.p50} | ${r.p90} | ${r.p95} | ${r.p99} | ${r.errors} | ${r.non2xx}\n`,
      );
    process.stdout.write(
      `\nuploads: ${uploads.map((u) => `${u.status} in ${(u.ms / 1000).toFixed(1)} s`).join(', ')}; all five done after ${(uploadWall / 1000).toFixed(1)} s; stored whole and under the right name: ${whole} of 5\n`,
    );
    process.stdout.write(
      `machine: ${os.cpus().length} cores, load average ${os
        .loadavg()
        .map((l) => l.toFixed(1))
        .join(' ')}\n`,
    );
  } finally {
    await stop();
  }
}

function log(message: string) {
  process.stdout.write(`[bench] ${message}\n`);
}

main().catch((error) => {
  process.stderr.write(`${error.stack ?? error}\n`);
  process.exit(1);
});
