import type { EntityManager } from 'typeorm';
import type { PublicationState } from '../../../../shared/models';
import type { BriefColumns, BriefModel } from '../../analysis/team-briefs';
import { conflict, notFound } from '../../lib/errors';
import { findDataset, loadDatasetColumns } from '../datasets/datasets.repository';
import { getModelRunForPublishing, setPublicationState } from '../models/models.repository';

/** What publishing needs of a model run (from the model runs module). */
export type PublishableRun = BriefModel & {
  id: string;
  datasetId: string;
  /** "requested" once the analyst asked the privacy officers to publish */
  publicationState: string;
  policyVersion: number;
  /** made under an older privacy policy version: review before publishing */
  needsReview?: boolean;
};

/** What publishing needs of a dataset: its columns for the engine and the outcome's window. */
export type PublishableColumns = BriefColumns & { window: { start: string; end: string } | null };

export type BriefSources = {
  loadRun: (modelRunId: string) => Promise<PublishableRun | null>;
  loadColumns: (datasetId: string) => Promise<PublishableColumns>;
  /** tells the model runs module that the run's briefs are out, or withdrawn and why */
  setPublicationState?: (
    modelRunId: string,
    state: 'published' | 'withdrawn',
    comment?: string,
    manager?: EntityManager,
  ) => Promise<void>;
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

/** A stored model run, as publishing needs it. */
export async function loadStoredRun(modelRunId: string): Promise<PublishableRun | null> {
  const run = await getModelRunForPublishing(modelRunId);
  if (!run) return null;
  if (!run.tree) throw conflict('This model run has no trained tree to publish.');
  return {
    id: run.id,
    datasetId: run.datasetId,
    publicationState: run.publicationState,
    policyVersion: run.policyVersion,
    needsReview: run.needsReview,
    tree: run.tree,
    drivers: run.drivers.map((d) => ({ feature: d.feature, suggestedAction: d.suggestedAction || null })),
  };
}

let sources: BriefSources = {
  loadRun: loadStoredRun,
  loadColumns: loadStoredColumns,
  setPublicationState: (id, state, comment, manager) =>
    setPublicationState(id, state satisfies PublicationState, comment, manager),
};

/** Where publishing reads model runs and dataset columns: their repositories, unless replaced. */
export function setBriefSources(next: Partial<BriefSources>): void {
  sources = { ...sources, ...next };
}

export function briefSources(): BriefSources {
  return sources;
}
