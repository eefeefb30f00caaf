import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker, type WorkerOptions } from 'node:worker_threads';

/**
 * Starts the worker thread `name` that lives beside the module `from` (its `import.meta.url`).
 * Built (`dist/server`, see scripts/build-server.mjs), every worker is a bundle `<name>.js` beside
 * the running bundle. Run from the TypeScript sources (tsx, vitest), a worker thread does not
 * inherit the process's TypeScript loader, so a small bootstrap registers tsx in the worker first.
 */
export function startWorker(from: string, name: string, options: WorkerOptions = {}): Worker {
  const here = fileURLToPath(from);
  const bundle = join(dirname(here), `${name}.js`);
  if (!here.endsWith('.ts') && existsSync(bundle)) return new Worker(bundle, options);
  const entry = pathToFileURL(join(dirname(here), `${name}.ts`)).href;
  const tsxRoot = dirname(createRequire(from).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const bootstrap = `import(${JSON.stringify(tsxApi)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(entry)}); });`;
  return new Worker(bootstrap, { ...options, eval: true });
}
