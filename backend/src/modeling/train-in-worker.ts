import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Table } from './table.js';
import type { ModelResult, Progress, TrainOptions } from './train.js';

/**
 * The worker entry. Run from TypeScript sources (tsx, vitest), a worker thread does not inherit a
 * TypeScript loader, so a small bootstrap registers tsx in the worker before importing the entry.
 */
function startWorker(workerData: unknown): Worker {
  const here = fileURLToPath(import.meta.url);
  const compiled = join(dirname(here), 'train-worker.js');
  if (!here.endsWith('.ts') && existsSync(compiled)) return new Worker(compiled, { workerData });
  const entry = pathToFileURL(join(dirname(here), 'train-worker.ts')).href;
  const tsxRoot = dirname(createRequire(import.meta.url).resolve('tsx/package.json'));
  const tsxApi = pathToFileURL(join(tsxRoot, 'dist', 'esm', 'api', 'index.mjs')).href;
  const bootstrap = `import(${JSON.stringify(tsxApi)}).then((tsx) => { tsx.register(); return import(${JSON.stringify(entry)}); });`;
  return new Worker(bootstrap, { eval: true, workerData });
}

/**
 * Trains in a worker thread so the server stays responsive. Progress arrives through
 * `onProgress`; `signal` stops the worker. Rejects with the engine's error message.
 */
export function trainInWorker(
  table: Table,
  label: ArrayLike<number>,
  options: TrainOptions = {},
  onProgress?: (progress: Progress) => void,
  signal?: AbortSignal,
): Promise<ModelResult> {
  return new Promise((resolve, reject) => {
    if (signal?.aborted) {
      reject(new Error('Training was cancelled'));
      return;
    }
    const worker = startWorker({ table, label: Uint8Array.from(label, (v) => (v ? 1 : 0)), options });
    let settled = false;
    const finish = (action: () => void) => {
      if (settled) return;
      settled = true;
      signal?.removeEventListener('abort', abort);
      action();
      void worker.terminate();
    };
    const abort = () => finish(() => reject(new Error('Training was cancelled')));
    signal?.addEventListener('abort', abort, { once: true });
    worker.on(
      'message',
      (message: { type: string; progress?: Progress; result?: ModelResult; message?: string }) => {
        if (message.type === 'progress' && message.progress) onProgress?.(message.progress);
        else if (message.type === 'result') finish(() => resolve(message.result!));
        else if (message.type === 'error') finish(() => reject(new Error(message.message)));
      },
    );
    worker.on('error', (error) => finish(() => reject(error)));
    worker.on('exit', (code) =>
      finish(() => reject(new Error(`The training worker stopped (exit code ${code})`))),
    );
  });
}
