import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Dataset } from './dataset.entity';

/**
 * One publication of a model run's team briefs. At most one publication per dataset is
 * "published" at a time: a newer one replaces it; a withdrawal (policy change, deletion of the
 * dataset) deletes its briefs at once.
 */
@Entity({ name: 'publications' })
@Index('publications_dataset_status', ['datasetId', 'status'])
export class Publication {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'model_run_id', type: 'uuid' })
  modelRunId: string;

  @Column({ name: 'dataset_id', type: 'uuid' })
  datasetId: string;

  /** deleting the dataset deletes its publications and, with them, every brief */
  @ManyToOne(() => Dataset, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset?: Dataset;

  /** computing | published | failed | replaced | withdrawn */
  @Column({ type: 'varchar', length: 20 })
  status: string;

  @Column({ name: 'policy_version', type: 'int' })
  policyVersion: number;

  @Column({ type: 'int' })
  k: number;

  /** the columns the published tree splits on: a field blocked later withdraws the briefs */
  @Column({ type: 'text', array: true, default: () => "'{}'" })
  features: string[];

  @Column({ name: 'published_by_id', type: 'uuid', nullable: true })
  publishedById: string | null;

  @Column({ name: 'published_by_email', type: 'varchar', length: 320, nullable: true })
  publishedByEmail: string | null;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;

  @Column({ name: 'published_at', type: 'timestamptz', nullable: true })
  publishedAt: Date | null;

  @Column({ name: 'team_count', type: 'int', nullable: true })
  teamCount: number | null;

  @Column({ name: 'withheld_team_count', type: 'int', nullable: true })
  withheldTeamCount: number | null;

  @Column({ name: 'ended_at', type: 'timestamptz', nullable: true })
  endedAt: Date | null;

  /** why the briefs were withdrawn or replaced, or why computing failed */
  @Column({ name: 'end_reason', type: 'text', nullable: true })
  endReason: string | null;
}
