import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One version of the organisation-wide privacy policy. A change never edits a row: it adds the
 * next version, with its author and reason. The current policy is the highest version.
 */
@Entity({ name: 'policy_versions' })
export class PolicyVersion {
  @PrimaryGeneratedColumn('identity', { type: 'int' })
  version: number;

  @Column({ type: 'int' })
  k: number;

  @Column({ name: 'blocked_fields', type: 'text', array: true, default: () => "'{}'" })
  blockedFields: string[];

  @Column({ name: 'proxy_threshold', type: 'double precision' })
  proxyThreshold: number;

  @Column({ name: 'retention_days', type: 'int' })
  retentionDays: number;

  @Column({ type: 'varchar', length: 500 })
  reason: string;

  @Column({ name: 'author_id', type: 'uuid', nullable: true })
  authorId: string | null;

  @Column({ name: 'author_email', type: 'varchar', length: 320, nullable: true })
  authorEmail: string | null;

  @Column({ name: 'created_at', type: 'timestamptz', default: () => 'now()' })
  createdAt: Date;
}
