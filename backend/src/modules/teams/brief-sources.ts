import type { BriefColumns, BriefModel } from '../../analysis/team-briefs';
import { AppError, notFound } from '../../lib/errors';
import { findDataset, loadDatasetColumns } from '../datasets/datasets.repository';

/** What publishing needs of a model run (from the model runs module). */
export type PublishableRun = BriefModel & {
  id: string;
  datasetId: string;
  /** "requested" once the analyst asked the privacy officers to publish */
  publicationState: string;
  policyVersion: number;
};

/** What publishing needs of a dataset: its columns for the engine and the outcome's window. */
export type PublishableColumns = BriefColumns & { window: { start: string; end: string } | null };

export type BriefSources = {
  loadRun: (modelRunId: string) => Promise<PublishableRun | null>;
  loadColumns: (datasetId: string) => Promise<PublishableColumns>;
  /** tells the model runs module that the run's briefs are out */
  setPublicationState?: (modelRunId: string, state: string, comment?: string) => Promise<void>;
};

/** The stored dataset's columns, with the window of its outcome mapping. */
export async function loadStoredColumns(datasetId: string): Promise<PublishableColumns> {
  const dataset = await findDataset(datasetId);
  if (!dataset) throw notFound('The dataset');
  const columns = await loadDatasetColumns(datasetId);
  const outcome = dataset.mapping?.outcome;
  return {
    ...columns,
    window: outcome?.kind === 'exit-dates' ? { start: outcome.windowStart, end: outcome.windowEnd } : null,
  };
}

const noModelRuns = async (): Promise<never> => {
  throw new AppError(
    'model_runs_unavailable',
    503,
    'Model runs are not available in this build yet, so nothing can be published.',
  );
};

let sources: BriefSources = { loadRun: noModelRuns, loadColumns: loadStoredColumns };

/**
 * Where publishing reads model runs and dataset columns. Datasets come from their repository;
 * model runs are wired in by the model runs module (tests wire engine-trained runs meanwhile).
 */
export function setBriefSources(next: Partial<BriefSources>): void {
  sources = { ...sources, ...next };
}

export function briefSources(): BriefSources {
  return sources;
}
