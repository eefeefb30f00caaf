// Builds the server for running without the TypeScript loader: `dist/server/` holds one bundle per
// process entry (app server, job worker) and per worker thread, with our code bundled and the npm
// packages left as imports. Production, `npm start`, the tests that start server processes and the
// benchmarks run these bundles; vitest runs the sources. `node scripts/build-server.mjs` or
// `npm run build` (which builds the web app as well).
import { copyFileSync, mkdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { build } from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** The bundles, by output name (each becomes `dist/server/<name>.js`). */
export const SERVER_ENTRIES = {
  server: 'backend/src/server.ts',
  worker: 'backend/src/worker.ts',
  // worker threads: started beside the bundle that starts them (see backend/src/lib/start-worker.ts)
  'intake-worker': 'backend/src/modules/datasets/intake-worker.ts',
  'train-worker': 'backend/src/modeling/train-worker.ts',
  'team-briefs-worker': 'backend/src/analysis/team-briefs-worker.ts',
};

export async function buildServer(outdir = path.join(root, 'dist', 'server')) {
  rmSync(outdir, { recursive: true, force: true });
  mkdirSync(outdir, { recursive: true });
  await build({
    absWorkingDir: root,
    entryPoints: Object.fromEntries(
      Object.entries(SERVER_ENTRIES).map(([name, file]) => [name, path.join(root, file)]),
    ),
    outdir,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    // npm packages stay imports, resolved from the repository's node_modules at run time
    packages: 'external',
    sourcemap: true,
    logLevel: 'warning',
  });
  // The workbook reader is plain JavaScript already, and must stay a file of its own: it is the
  // only code that meets the xlsx package (see parse-xlsx.ts).
  copyFileSync(
    path.join(root, 'backend/src/modules/datasets/parsing/xlsx-worker.mjs'),
    path.join(outdir, 'xlsx-worker.mjs'),
  );
  return outdir;
}

if (process.argv[1] && pathToFileURL(process.argv[1]).href === import.meta.url) {
  const started = Date.now();
  const outdir = await buildServer();
  process.stdout.write(
    `built the server into ${path.relative(root, outdir)} in ${((Date.now() - started) / 1000).toFixed(1)} s\n`,
  );
}
