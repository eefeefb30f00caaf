import { createHash } from 'node:crypto';
import { findDataset, loadDatasetColumns } from '../datasets/datasets.repository';
import { latestProxyDecisions } from '../review/review.repository';
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
  /** the state of the dataset the run trains on: a digest of its mapping, which changes with it */
  version: string | null;
  dataWindow: { start: string; end: string } | null;
  profile: ProfiledColumn[];
  /** allowed columns the privacy officer blocked for this dataset as proxies: column → why */
  blockedProxies: Record<string, string>;
};

export async function findDatasetForModelling(id: string): Promise<DatasetForModelling | null> {
  const dataset = await findDataset(id);
  if (!dataset) return null;
  const outcome = dataset.mapping?.outcome;
  return {
    id: dataset.id,
    name: dataset.name,
    version: dataset.mapping
      ? createHash('sha256').update(JSON.stringify(dataset.mapping)).digest('hex').slice(0, 16)
      : null,
    dataWindow:
      outcome?.kind === 'exit-dates' ? { start: outcome.windowStart, end: outcome.windowEnd } : null,
    profile: dataset.columns,
    blockedProxies: Object.fromEntries(
      (await latestProxyDecisions(id))
        .filter((d) => d.decision === 'block')
        .map((d) => [d.feature, `blocked by the privacy officer as a proxy of "${d.blockedField}"`]),
    ),
  };
}

// The columns read to start a run, kept for the worker of this process so that it need not read a
// large dataset a second time; one entry, taken once, checked against the dataset's version.
let recent: { datasetId: string; version: string | null; input: TrainingInput } | null = null;

export async function loadTrainingInput(datasetId: string): Promise<TrainingInput> {
  return loadDatasetColumns(datasetId);
}

export function keepTrainingInput(datasetId: string, version: string | null, input: TrainingInput): void {
  recent = { datasetId, version, input };
}

/** The columns for a run: those kept when it was queued if they are still current, else read again. */
export async function trainingInputFor(datasetId: string, version: string | null): Promise<TrainingInput> {
  const kept = recent;
  if (kept && kept.datasetId === datasetId) {
    recent = null;
    const dataset = await findDatasetForModelling(datasetId);
    if (dataset && dataset.version === version && kept.version === version) return kept.input;
  }
  return loadTrainingInput(datasetId);
}
