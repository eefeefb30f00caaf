import { createHash } from 'node:crypto';
import { findDataset, loadDatasetColumns } from '../datasets/datasets.repository';
import type { ProfiledColumn } from './feature-rules';

/** A mapped dataset as the engine needs it (the datasets module's engine columns). */
export type TrainingInput = {
  rowCount: number;
  labels: ArrayLike<number>;
  features: {
    name: string;
    kind: 'numeric' | 'categorical';
    values: (number | null)[] | (string | null)[];
    protectedCharacteristic: string | null;
    derivedFrom?: string;
  }[];
};

/** What a model run records of its dataset. */
export type DatasetForModelling = {
  id: string;
  name: string;
  approved: boolean;
  /** the state of the dataset the run trains on: a digest of its mapping, which changes with it */
  version: string | null;
  dataWindow: { start: string; end: string } | null;
  profile: ProfiledColumn[];
};

/**
 * Until the privacy officer's dataset approval is stored (DatasetStatus gains 'approved'), a
 * mapped dataset is taken as approved; an unmapped one never is.
 */
function isApproved(status: string): boolean {
  return status === 'approved' || status === 'mapped';
}

export async function findDatasetForModelling(id: string): Promise<DatasetForModelling | null> {
  const dataset = await findDataset(id);
  if (!dataset) return null;
  const outcome = dataset.mapping?.outcome;
  return {
    id: dataset.id,
    name: dataset.name,
    approved: isApproved(dataset.status),
    version: dataset.mapping
      ? createHash('sha256').update(JSON.stringify(dataset.mapping)).digest('hex').slice(0, 16)
      : null,
    dataWindow:
      outcome?.kind === 'exit-dates' ? { start: outcome.windowStart, end: outcome.windowEnd } : null,
    profile: dataset.columns,
  };
}

export async function loadTrainingInput(datasetId: string): Promise<TrainingInput> {
  return loadDatasetColumns(datasetId);
}
