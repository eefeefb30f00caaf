import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Dataset } from './dataset.entity';

/**
 * The values of one column of a dataset as one JSONB array (row order of the dataset): loads back
 * into the engine's columnar table without reshaping. `role` tells file columns from values the
 * mapping derived (the outcome labels, tenure).
 */
@Entity({ name: 'dataset_columns' })
@Index(['datasetId', 'role', 'position'])
export class DatasetColumn {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'dataset_id', type: 'uuid' })
  datasetId: string;

  @ManyToOne(
    () => Dataset,
    (dataset) => dataset.columns,
    { onDelete: 'CASCADE' },
  )
  @JoinColumn({ name: 'dataset_id' })
  dataset: Dataset;

  /** 'source': a column of the file; 'outcome': labels (1, 0, null = excluded); 'derived': e.g. tenure */
  @Column({ type: 'varchar', length: 20 })
  role: 'source' | 'outcome' | 'derived';

  @Column({ type: 'integer' })
  position: number;

  @Column({ type: 'varchar', length: 200 })
  name: string;

  /** number, category, date, yes-no, identifier (stored as keyed hashes) */
  @Column({ type: 'varchar', length: 20 })
  type: string;

  /** dates only: 'dmy', 'mdy', 'ambiguous' or 'not-needed' */
  @Column({ name: 'date_order', type: 'varchar', length: 20, nullable: true })
  dateOrder: string | null;

  @Column({ type: 'jsonb' })
  values: (string | number | null)[];
}
