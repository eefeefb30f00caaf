import { Column, Entity, Index, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import type { ColumnProfile, DatasetMapping, OutcomePreview } from '../../../shared/datasets';
import { DatasetColumn } from './dataset-column.entity';

/**
 * An uploaded staff export after parsing: its profile and mapping. The raw file is never kept;
 * the values live in dataset_columns, one JSONB array per column, and go with the dataset.
 */
@Entity({ name: 'datasets' })
@Index(['uploadedAt'])
export class Dataset {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'varchar', length: 200 })
  name: string;

  /** 'profiled' after upload, 'mapped' once the mapping is saved */
  @Column({ type: 'varchar', length: 20 })
  status: 'profiled' | 'mapped';

  @Column({ name: 'row_count', type: 'integer' })
  rowCount: number;

  @Column({ type: 'varchar', length: 10 })
  format: 'xlsx' | 'csv';

  @Column({ name: 'uploaded_by_id', type: 'uuid', nullable: true })
  uploadedById: string | null;

  @Column({ name: 'uploaded_by_email', type: 'varchar', length: 320 })
  uploadedByEmail: string;

  @Column({ name: 'uploaded_at', type: 'timestamptz', default: () => 'now()' })
  uploadedAt: Date;

  @Column({ name: 'sheet_name', type: 'varchar', length: 200, nullable: true })
  sheetName: string | null;

  @Column({ name: 'sheet_names', type: 'jsonb', default: () => "'[]'" })
  sheetNames: string[];

  @Column({ type: 'jsonb', default: () => "'[]'" })
  warnings: string[];

  /** Profile of every column of the file, including those dropped before storage (no values of those). */
  @Column({ type: 'jsonb' })
  profile: ColumnProfile[];

  /** Columns whose values were never stored (direct identifiers, free text) or deleted by the mapping. */
  @Column({ name: 'dropped_columns', type: 'jsonb', default: () => "'[]'" })
  droppedColumns: { name: string; reason: string }[];

  @Column({ type: 'jsonb', nullable: true })
  mapping: DatasetMapping | null;

  @Column({ type: 'jsonb', nullable: true })
  preview: OutcomePreview | null;

  @Column({ name: 'mapped_at', type: 'timestamptz', nullable: true })
  mappedAt: Date | null;

  /** Spreadsheet row number of each stored row, so that later problems can name rows. */
  @Column({ name: 'row_numbers', type: 'jsonb', select: false })
  rowNumbers: number[];

  @OneToMany(
    () => DatasetColumn,
    (column) => column.dataset,
  )
  columns: DatasetColumn[];
}
