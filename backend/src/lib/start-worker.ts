import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker, type WorkerOptions } from 'node:worker_threads';

// Background work (reading uploads, training, computing briefs) yields the CPU to the thread that
// answers requests: the worker lowers its own nice value to 10 before it loads its entry. On Linux
// the nice value belongs to the thread, so this leaves the rest of the process alone; elsewhere
// it would lower the whole process, so it is skipped there.
const BELOW_NORMAL =
  process.platform === 'linux' ? "try { require('node:os').setPriority(0, 10); } catch {}\n" : '';

/**
 * Starts the worker thread `name` that lives beside the module `from` (its `import.meta.url`), at
 * a lower CPU priority than requests. Built (`dist/server`, see scripts/build-server.mjs), every
 * worker is a bundle `<name>.js` beside the running bundle. Run from the TypeScript sources (tsx,
 * vitest), a worker thread does not inherit the process's TypeScript loader, so the bootstrap
 * registers tsx in the worker first.
 */
export function startWorker(from: string, name: string, options: WorkerOptions = {}): Worker {
  const here = fileURLToPath(from);
  const bundle = join(dirname(here), `${name}.js`);
  if (!here.endsWith('.ts') && existsSync(bundle)) {
    return new Worker(`${BELOW_NORMAL}import(${JSON.stringify(pathToFileURL(bundle).href)});`, {
      ...options,
      eval: true,
    });
  }
  const entry = pathToFileURL(join(dirname(here), `${name}.ts`)).href;
  const tsxRoot = dirname(createRequire(from).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const bootstrap = `${BELOW_NORMAL}import(${JSON.stringify(tsxApi)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(entry)}); });`;
  return new Worker(bootstrap, { ...options, eval: true });
}
