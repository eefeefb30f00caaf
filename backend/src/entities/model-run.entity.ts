import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type {
  ExcludedFeature,
  ModelRunPhase,
  ModelRunSettings,
  ModelRunStatus,
  PublicationState,
} from '../../../shared/models';
import { Dataset } from './dataset.entity';

/**
 * A model run: the settings it was trained with (with the seed, enough to train it again from the
 * dataset), the policy version in force, its progress while it trains, and the engine's result
 * (the full tree, unwithheld: responses withhold small nodes when they are read).
 */
@Entity({ name: 'model_runs' })
@Index(['datasetId'])
@Index(['createdAt'])
export class ModelRun {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'dataset_id', type: 'uuid' })
  datasetId: string;

  /** deleting a dataset deletes the runs trained on it */
  @ManyToOne(() => Dataset, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset?: Dataset;

  @Column({ name: 'dataset_name', type: 'varchar', length: 200, nullable: true })
  datasetName: string | null;

  /** the dataset's state when the run was queued (its mapping time), so a re-mapped dataset shows */
  @Column({ name: 'dataset_version', type: 'varchar', length: 80, nullable: true })
  datasetVersion: string | null;

  @Column({ name: 'data_window', type: 'jsonb', nullable: true })
  dataWindow: { start: string; end: string } | null;

  @Column({ type: 'varchar', length: 20 })
  status: ModelRunStatus;

  @Column({ type: 'double precision', default: 0 })
  progress: number;

  @Column({ type: 'varchar', length: 30, nullable: true })
  phase: ModelRunPhase | null;

  @Column({ type: 'jsonb' })
  settings: ModelRunSettings;

  @Column({ name: 'policy_version', type: 'integer' })
  policyVersion: number;

  @Column({ type: 'integer' })
  k: number;

  /** the feature columns given to the engine */
  @Column({ type: 'jsonb' })
  features: string[];

  /** columns kept out of the features, with the reason (blocked field, derived from one) */
  @Column({ name: 'excluded_features', type: 'jsonb' })
  excludedFeatures: ExcludedFeature[];

  /** the engine's result, plain JSON (see models.repository); large, so read only when asked for */
  @Column({ type: 'jsonb', nullable: true, select: false })
  result: Record<string, unknown> | null;

  @Column({ type: 'text', nullable: true })
  error: string | null;

  @Column({ name: 'cancel_requested', type: 'boolean', default: false })
  cancelRequested: boolean;

  /** how many times a worker claimed the run: 1 for every run that ran */
  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ name: 'worker_name', type: 'varchar', length: 200, nullable: true })
  workerName: string | null;

  @Column({ name: 'needs_review', type: 'boolean', default: false })
  needsReview: boolean;

  @Column({ name: 'publication_state', type: 'varchar', length: 20, default: 'draft' })
  publicationState: PublicationState;

  @Column({ name: 'publication_comment', type: 'text', nullable: true })
  publicationComment: string | null;

  /** the analyst's suggested action per driver (feature name → text) */
  @Column({ name: 'driver_actions', type: 'jsonb', default: () => "'{}'" })
  driverActions: Record<string, string>;

  @Column({ name: 'created_by_id', type: 'uuid', nullable: true })
  createdById: string | null;

  @Column({ name: 'created_by_email', type: 'varchar', length: 320 })
  createdByEmail: string;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;

  @Column({ name: 'started_at', type: 'timestamptz', nullable: true })
  startedAt: Date | null;

  @Column({ name: 'finished_at', type: 'timestamptz', nullable: true })
  finishedAt: Date | null;

  /** last sign of life from the worker training it */
  @Column({ name: 'heartbeat_at', type: 'timestamptz', nullable: true })
  heartbeatAt: Date | null;
}
