import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Dataset } from './dataset.entity';

/**
 * A privacy officer's decision on a mapped dataset: approved for modelling, or sent back with a
 * comment. The latest decision counts; it records the policy version it was made under.
 */
@Entity({ name: 'dataset_approvals' })
@Index(['datasetId', 'decidedAt'])
export class DatasetApproval {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'dataset_id', type: 'uuid' })
  datasetId: string;

  @ManyToOne(() => Dataset, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset: Dataset;

  @Column({ type: 'varchar', length: 20 })
  decision: 'approved' | 'sent-back';

  @Column({ type: 'varchar', length: 1000, nullable: true })
  comment: string | null;

  @Column({ name: 'policy_version', type: 'int' })
  policyVersion: number;

  /** the mapping the decision was about: a new mapping needs a new decision */
  @Column({ name: 'mapped_at', type: 'timestamptz' })
  mappedAt: Date;

  @Column({ name: 'decided_by_id', type: 'uuid', nullable: true })
  decidedById: string | null;

  @Column({ name: 'decided_by_email', type: 'varchar', length: 320 })
  decidedByEmail: string;

  @Column({ name: 'decided_at', type: 'timestamptz', default: () => 'now()' })
  decidedAt: Date;
}
