import type { ModelRunPhase } from '../../../../shared/models';
import { logger } from '../../lib/logger';
import { buildTable, type ColumnInput } from '../../modeling/table';
import { evaluate, type Progress, type TrainOptions } from '../../modeling/train';
import { trainInWorker } from '../../modeling/train-in-worker';
import { predict } from '../../modeling/tree-json';
import { type TrainingInput, trainingInputFor } from './dataset-input';
import {
  claimModelRun,
  finishModelRun,
  holdRunLock,
  isCancelRequested,
  type ModelRunRecord,
  reportProgress,
} from './models.repository';
import type { StoredResult } from './result-view';

const PROGRESS_EVERY_MS = 300;
const CANCEL_CHECK_EVERY_MS = 500;

/** The engine's options from a run's stored settings: the same settings train the same tree. */
export function engineOptions(run: Pick<ModelRunRecord, 'settings' | 'features'>): TrainOptions {
  const s = run.settings;
  return {
    criterion: s.criterion,
    maxDepth: s.maxDepth,
    minLeaf: s.effectiveMinLeaf,
    classWeight: s.classWeight,
    pruning: s.pruning,
    folds: s.folds,
    seed: s.seed,
    k: s.k,
    features: run.features,
  };
}

/** The engine's table with the run's features only: other columns never reach the engine. */
export function trainingTable(input: TrainingInput, features: string[]) {
  const byName = new Map(input.features.map((f) => [f.name, f]));
  const columns = features.map((name): ColumnInput => {
    const f = byName.get(name);
    if (!f) throw new RunFailure(`The dataset no longer has the column "${name}" this run was set up with.`);
    return f.kind === 'numeric'
      ? { name, kind: 'numeric', values: f.values as (number | null)[] }
      : { name, kind: 'categorical', values: f.values as (string | null)[] };
  });
  return buildTable(columns);
}

/** A failure whose message already says what to do. */
export class RunFailure extends Error {}

/** Turns an engine or loading error into a message a person can act on. */
export function failureMessage(error: unknown): string {
  if (error instanceof RunFailure) return error.message;
  const message = error instanceof Error ? error.message : String(error);
  if (/only one class/i.test(message)) {
    return 'Every employee in this dataset has the same outcome (all leavers or all stayers), so there is nothing to learn. Check the outcome in the dataset mapping: the window dates and which exit reasons count as voluntary.';
  }
  if (/stopped \(exit code|out of memory/i.test(message)) {
    return 'The training stopped unexpectedly (the worker ran out of memory or was stopped). Start the run again; for a very large dataset, lower the maximum depth or the number of folds.';
  }
  if (/was not found/i.test(message)) {
    return 'The dataset was deleted before this run could train. Choose another dataset and start a new run.';
  }
  return `Training failed: ${message} Start the run again; if it fails the same way, send this message to your administrator.`;
}

/**
 * Trains one queued run: claims it (only one worker can), loads the dataset, trains in a worker
 * thread with progress stored as it goes, and stores the result, the failure or the cancellation.
 */
export async function trainModelRun(runId: string, workerName: string): Promise<void> {
  const run = await claimModelRun(runId, workerName);
  if (!run) return;
  const release = await holdRunLock(runId);
  try {
    await trainClaimedRun(run);
  } finally {
    await release();
  }
}

/** Trains a run this worker has claimed (status running). */
export async function trainClaimedRun(run: ModelRunRecord): Promise<void> {
  const runId = run.id;
  const abort = new AbortController();
  let lastWrite = 0;
  let lastPhase: ModelRunPhase = 'loading';
  let pending: Promise<unknown> = Promise.resolve();
  const onProgress = ({ phase, progress }: Progress | { phase: 'loading'; progress: number }) => {
    const now = Date.now();
    if (phase === lastPhase && now - lastWrite < PROGRESS_EVERY_MS && progress < 1) return;
    lastWrite = now;
    lastPhase = phase;
    pending = pending
      .then(() => reportProgress(runId, progress, phase))
      .then((stop) => {
        if (stop) abort.abort();
      })
      .catch((error) => logger.warn({ err: error, runId }, 'could not store progress'));
  };
  const watcher = setInterval(() => {
    isCancelRequested(runId)
      .then((stop) => {
        if (stop) abort.abort();
      })
      .catch(() => {});
  }, CANCEL_CHECK_EVERY_MS);
  try {
    const input = await trainingInputFor(run.datasetId, run.datasetVersion);
    if (await isCancelRequested(runId)) abort.abort();
    if (abort.signal.aborted) throw new Error('Training was cancelled');
    const table = trainingTable(input, run.features);
    onProgress({ phase: 'loading', progress: 0.02 });
    const result = await trainInWorker(table, input.labels, engineOptions(run), onProgress, abort.signal);
    // Without cross-validation (too few leavers for the folds), the figures are in-sample.
    const inSample = result.crossValidation
      ? null
      : evaluate(Array.from(input.labels), predict(result.tree, table), result.settings.threshold);
    await pending;
    const stored: StoredResult = { ...result, inSample };
    await finishModelRun(runId, { status: 'done', result: stored });
  } catch (error) {
    await pending;
    if (abort.signal.aborted) {
      await finishModelRun(runId, { status: 'cancelled' });
    } else {
      logger.info({ err: error, runId }, 'model run failed');
      await finishModelRun(runId, { status: 'failed', error: failureMessage(error) });
    }
  } finally {
    clearInterval(watcher);
  }
}
