import type { BriefColumns, BriefModel } from '../../analysis/team-briefs';
import { AppError } from '../../lib/errors';

/** What publishing needs of a model run (from the model runs module). */
export type PublishableRun = BriefModel & {
  id: string;
  datasetId: string;
  /** "requested" once the analyst asked the privacy officers to publish */
  publicationState: string;
  policyVersion: number;
};

/** What publishing needs of a dataset (from the datasets module). */
export type PublishableColumns = BriefColumns & { window: { start: string; end: string } | null };

export type BriefSources = {
  loadRun: (modelRunId: string) => Promise<PublishableRun | null>;
  loadColumns: (datasetId: string) => Promise<PublishableColumns>;
  /** tells the model runs module that the run's briefs are out (or withdrawn) */
  setPublicationState?: (modelRunId: string, state: string, comment?: string) => Promise<void>;
};

const unavailable = (): never => {
  throw new AppError(
    'model_runs_unavailable',
    503,
    'Model runs and stored datasets are not available in this build yet, so nothing can be published.',
  );
};

let sources: BriefSources = { loadRun: unavailable, loadColumns: unavailable };

/**
 * Where publishing reads model runs and dataset columns. The runtime wires the model runs and
 * datasets repositories in here; tests wire engine-trained runs on the invented demo data.
 */
export function setBriefSources(next: BriefSources): void {
  sources = next;
}

export function briefSources(): BriefSources {
  return sources;
}
