import { parentPort, workerData } from 'node:worker_threads';
import type { Table } from './table.js';
import { type TrainOptions, trainModel } from './train.js';

/** Worker-thread entry of trainInWorker: trains once and posts progress, then the result. */
const { table, label, options } = workerData as {
  table: Table;
  label: ArrayLike<number>;
  options: TrainOptions;
};
try {
  const result = trainModel(table, label, options, (progress) =>
    parentPort!.postMessage({ type: 'progress', progress }),
  );
  parentPort!.postMessage({ type: 'result', result });
} catch (error) {
  parentPort!.postMessage({ type: 'error', message: error instanceof Error ? error.message : String(error) });
}
