import { AppError } from '../../lib/errors';
import type { ProfiledColumn } from './feature-rules';

const notYet = () =>
  new AppError('datasets_unavailable', 503, 'Datasets cannot be modelled on this server yet.');

/** A mapped dataset as the engine needs it (the datasets module's engine columns fit this). */
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
  /** the state of the dataset the run trains on (changes when the mapping changes) */
  version: string | null;
  dataWindow: { start: string; end: string } | null;
  profile: ProfiledColumn[];
};

export async function findDatasetForModelling(_id: string): Promise<DatasetForModelling | null> {
  throw notYet();
}

export async function loadTrainingInput(_datasetId: string): Promise<TrainingInput> {
  throw notYet();
}
