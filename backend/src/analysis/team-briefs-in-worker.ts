import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { BriefColumns, BriefModel, BriefSettings, ComputedTeam } from './team-briefs.js';

/** As the engine's trainInWorker: under tsx or vitest the worker registers tsx before the entry. */
function startWorker(workerData: unknown): Worker {
  const here = fileURLToPath(import.meta.url);
  const compiled = join(dirname(here), 'team-briefs-worker.js');
  if (!here.endsWith('.ts') && existsSync(compiled)) return new Worker(compiled, { workerData });
  const entry = pathToFileURL(join(dirname(here), 'team-briefs-worker.ts')).href;
  const tsxRoot = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const bootstrap = `import(${JSON.stringify(tsxApi)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(entry)}); });`;
  return new Worker(bootstrap, { eval: true, workerData });
}

/** Computes the briefs in a worker thread, so the process keeps answering requests meanwhile. */
export function computeTeamBriefsInWorker(
  columns: BriefColumns,
  model: BriefModel,
  settings: Omit<BriefSettings, 'teamId'>,
): Promise<ComputedTeam[]> {
  return new Promise((resolve, reject) => {
    const worker = startWorker({ columns, model, settings });
    let settled = false;
    const finish = (action: () => void) => {
      if (settled) return;
      settled = true;
      action();
      void worker.terminate();
    };
    worker.on('message', (message: { type: string; result?: ComputedTeam[]; message?: string }) => {
      if (message.type === 'result') finish(() => resolve(message.result!));
      else finish(() => reject(new Error(message.message)));
    });
    worker.on('error', (error) => finish(() => reject(error)));
    worker.on('exit', (code) =>
      finish(() => reject(new Error(`The brief computation stopped (exit code ${code})`))),
    );
  });
}
