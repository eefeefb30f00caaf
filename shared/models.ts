import { z } from 'zod';
import type { TreeNode } from './tree';

export const MODEL_LIMITS = {
  maxDepth: { min: 1, max: 12 },
  minLeaf: { min: 1, max: 10_000 },
  folds: { min: 2, max: 10 },
  seed: { min: 0, max: 2_147_483_647 },
  action: { max: 1000 },
  comment: { max: 2000 },
} as const;

const whole = (field: string, min: number, max: number) =>
  z
    .number({ error: `${field} must be a whole number from ${min} to ${max}` })
    .int(`${field} must be a whole number from ${min} to ${max}`)
    .min(min, `${field} must be at least ${min}`)
    .max(max, `${field} must be at most ${max}`);

export const CRITERIA = {
  gini: 'Gini impurity: how often two employees drawn from a group would differ in outcome.',
  entropy: 'Entropy (information gain): how many bits of surprise the outcome holds in a group.',
} as const;

/** `POST /api/models`: all but `datasetId` optional, with the defaults of API.md. */
export const modelRunRequestSchema = z.strictObject({
  datasetId: z.uuid({ error: 'datasetId must be the id of a dataset' }),
  criterion: z.enum(['gini', 'entropy'], { error: 'criterion must be "gini" or "entropy"' }).default('gini'),
  maxDepth: whole('maxDepth', MODEL_LIMITS.maxDepth.min, MODEL_LIMITS.maxDepth.max).default(6),
  minLeaf: whole('minLeaf', MODEL_LIMITS.minLeaf.min, MODEL_LIMITS.minLeaf.max).default(25),
  classWeight: z
    .enum(['none', 'balanced'], { error: 'classWeight must be "none" or "balanced"' })
    .default('none'),
  pruning: z.enum(['cv', 'none'], { error: 'pruning must be "cv" or "none"' }).default('cv'),
  folds: whole('folds', MODEL_LIMITS.folds.min, MODEL_LIMITS.folds.max).default(5),
  seed: whole('seed', MODEL_LIMITS.seed.min, MODEL_LIMITS.seed.max).default(1),
  /** the feature columns to consider; default: every allowed column. Blocked ones are refused. */
  features: z.array(z.string().min(1).max(200)).max(500).optional(),
});
export type ModelRunRequest = z.infer<typeof modelRunRequestSchema>;
export type ModelRunRequestInput = z.input<typeof modelRunRequestSchema>;

/** `PUT /api/models/:id/drivers/:feature/action` */
export const driverActionSchema = z.strictObject({
  text: z
    .string({ error: 'text must be the suggested action, in words' })
    .trim()
    .max(MODEL_LIMITS.action.max, `A suggested action is at most ${MODEL_LIMITS.action.max} characters`),
});

/** `POST /api/models/:id/publication-request` */
export const publicationRequestSchema = z.strictObject({
  comment: z.string().trim().max(MODEL_LIMITS.comment.max).optional(),
});

/** `POST /api/models/:id/send-back`: the privacy officer says what needs to change. */
export const sendBackSchema = z.strictObject({
  comment: z
    .string({ error: 'comment is required: say what needs to change before publication' })
    .trim()
    .min(3, 'comment is required: say what needs to change before publication')
    .max(MODEL_LIMITS.comment.max),
});

export type ModelRunStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';
export type ModelRunPhase = 'loading' | 'cross-validating' | 'pruning' | 'fitting' | 'explaining';
export type PublicationState = 'draft' | 'requested' | 'sent_back' | 'published' | 'withdrawn';

export type Withheld = { withheld: true };
export type MaybeWithheld<T> = T | Withheld;

export type ExcludedFeature = { name: string; reason: string };

/** The settings a run was trained with: enough, with the dataset, to train it again. */
export type ModelRunSettings = {
  criterion: 'gini' | 'entropy';
  maxDepth: number;
  /** what the analyst asked for */
  minLeaf: number;
  /** max(minLeaf, k): what the engine used */
  effectiveMinLeaf: number;
  classWeight: 'none' | 'balanced';
  pruning: 'cv' | 'none';
  folds: number;
  seed: number;
  k: number;
  /** features the analyst asked for, or null for all allowed ones */
  requestedFeatures: string[] | null;
};

export type Spread = { mean: number; sd: number };

export type HeadlineMetrics = {
  auc: number;
  precision: number;
  recall: number;
  accuracy: number;
  f1: number;
  brier: number;
  averagePrecision: number;
  baseRate: number;
};

export type ModelRunSummary = {
  id: string;
  datasetId: string;
  datasetName: string | null;
  status: ModelRunStatus;
  progress: number;
  phase: ModelRunPhase | null;
  settings: ModelRunSettings;
  policyVersion: number;
  needsReview: boolean;
  publicationState: PublicationState;
  publicationComment: string | null;
  createdBy: string;
  createdAt: string;
  finishedAt: string | null;
  error: string | null;
  /** cross-validated mean AUC (or the training AUC without cross-validation), once done */
  auc: number | null;
};

export type ModelDriver = {
  feature: string;
  importance: number;
  /** which values raise the leaver share, in words */
  direction: string;
  /** the same in one word: higher values raise, lower values raise, or it depends (categories, mixed) */
  trend: 'raises' | 'lowers' | 'mixed';
  suggestedAction: string;
};

export type ModelSegment =
  | { id: string; withheld: true }
  | { id: string; withheld: false; rule: string; n: number; positive: number; share: number; lift: number };

export type ConfusionView = MaybeWithheld<{
  threshold: number;
  truePositive: number;
  falsePositive: number;
  trueNegative: number;
  falseNegative: number;
}>;

export type ModelResultView = {
  rowCount: number;
  positive: number;
  baseRate: number;
  /** pooled out-of-fold metrics (in-sample only where cross-validation was impossible), at the base-rate threshold */
  metrics: HeadlineMetrics;
  metricsSource: 'cross-validation' | 'training';
  /** mean and standard deviation across folds; null without cross-validation */
  crossValidation: { folds: number; metrics: Record<keyof HeadlineMetrics, Spread> } | null;
  /** pooled out-of-fold (or training) scores, so the page can move the threshold */
  roc: { threshold: number; falsePositiveRate: number; truePositiveRate: number }[];
  calibration: MaybeWithheld<{ decile: number; n: number; meanPredicted: number; observedRate: number }>[];
  gains: { decile: number; populationShare: number; positiveShare: number; lift: number }[];
  confusion: ConfusionView;
  pruning: { alpha: number; rule: 'one-standard-error' | 'none'; leaves: number };
  tree: TreeNode;
  segments: ModelSegment[];
  drivers: ModelDriver[];
};

export type ModelRunDetail = ModelRunSummary & {
  k: number;
  features: string[];
  excludedFeatures: ExcludedFeature[];
  dataWindow: { start: string; end: string } | null;
  result: ModelResultView | null;
};

/** `GET /api/models/feature-options?datasetId=`: the run form's feature list under the current policy. */
export type FeatureOptions = {
  datasetId: string;
  k: number;
  policyVersion: number;
  features: { name: string; kind: 'numeric' | 'categorical'; blocked: string | null }[];
};

/** 202 body of `POST /api/models`. */
export type ModelRunCreated = {
  id: string;
  status: 'queued';
  minLeaf: number;
  minLeafRaisedToK: boolean;
  notices: string[];
  features: string[];
  excludedFeatures: ExcludedFeature[];
};
