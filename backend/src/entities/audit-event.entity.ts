import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/**
 * One line of the append-only audit trail: who did what, when, to which object. Never holds
 * employee-level data. PostgreSQL itself refuses UPDATE, DELETE and TRUNCATE on the table.
 */
@Entity({ name: 'audit_events' })
@Index(['at'])
@Index(['action'])
export class AuditEvent {
  @PrimaryGeneratedColumn('identity', { type: 'bigint' })
  id: string;

  @Column({ type: 'timestamptz', default: () => 'now()' })
  at: Date;

  @Column({ name: 'actor_id', type: 'uuid', nullable: true })
  actorId: string | null;

  @Column({ name: 'actor_email', type: 'varchar', length: 320, nullable: true })
  actorEmail: string | null;

  @Column({ type: 'varchar', length: 80 })
  action: string;

  @Column({ name: 'object_type', type: 'varchar', length: 40, nullable: true })
  objectType: string | null;

  @Column({ name: 'object_id', type: 'varchar', length: 80, nullable: true })
  objectId: string | null;

  @Column({ type: 'jsonb', default: () => "'{}'" })
  details: Record<string, unknown>;
}
