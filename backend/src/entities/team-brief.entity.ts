import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import type { OrWithheld, TeamBriefResponse } from '../../../shared/briefs';
import { Publication } from './publication.entity';

/** One team's stored brief, computed once at publication as its manager sees it. */
@Entity({ name: 'team_briefs' })
@Index('team_briefs_manager', ['managerEmail'])
export class TeamBriefRecord {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'publication_id', type: 'uuid' })
  @Index('team_briefs_publication')
  publicationId: string;

  @ManyToOne(() => Publication, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'publication_id' })
  publication?: Publication;

  @Column({ type: 'varchar', length: 300 })
  name: string;

  @Column({ type: 'varchar', length: 300, nullable: true })
  department: string | null;

  /** lower-cased manager e-mail from the dataset */
  @Column({ name: 'manager_email', type: 'varchar', length: 320, nullable: true })
  managerEmail: string | null;

  @Column({ type: 'boolean' })
  withheld: boolean;

  @Column({ type: 'int', nullable: true })
  headcount: number | null;

  @Column({ type: 'jsonb' })
  summary: { attritionRate: OrWithheld<number> | null; organisationRate: OrWithheld<number> | null };

  @Column({ type: 'jsonb' })
  brief: TeamBriefResponse;
}
