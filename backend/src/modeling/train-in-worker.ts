import { startWorker } from '../lib/start-worker';
import type { Table } from './table.js';
import type { ModelResult, Progress, TrainOptions } from './train.js';

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
    const worker = startWorker(import.meta.url, 'train-worker', {
      workerData: { table, label: Uint8Array.from(label, (v) => (v ? 1 : 0)), options },
    });
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
