import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Dataset } from './dataset.entity';

/**
 * What a privacy officer decided about an allowed field flagged as a proxy for a blocked one in a
 * dataset: block it too, or accept it with a written reason. The latest decision per pair counts.
 */
@Entity({ name: 'proxy_decisions' })
@Index(['datasetId', 'feature', 'blockedField'])
export class ProxyDecision {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'dataset_id', type: 'uuid' })
  datasetId: string;

  @ManyToOne(() => Dataset, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'dataset_id' })
  dataset: Dataset;

  @Column({ type: 'varchar', length: 200 })
  feature: string;

  @Column({ name: 'blocked_field', type: 'varchar', length: 200 })
  blockedField: string;

  @Column({ type: 'varchar', length: 10 })
  decision: 'block' | 'accept';

  @Column({ type: 'varchar', length: 500 })
  reason: string;

  /** Cramér's V when the decision was made */
  @Column({ name: 'cramers_v', type: 'double precision' })
  cramersV: number;

  @Column({ name: 'policy_version', type: 'int' })
  policyVersion: number;

  @Column({ name: 'decided_by_id', type: 'uuid', nullable: true })
  decidedById: string | null;

  @Column({ name: 'decided_by_email', type: 'varchar', length: 320 })
  decidedByEmail: string;

  @Column({ name: 'decided_at', type: 'timestamptz', default: () => 'now()' })
  decidedAt: Date;
}
