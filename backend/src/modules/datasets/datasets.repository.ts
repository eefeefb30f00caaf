import type { EntityManager } from 'typeorm';
import type {
  DatasetDetail,
  DatasetMapping,
  DatasetSummary,
  OutcomePreview,
} from '../../../../shared/datasets';
import { Dataset } from '../../entities/dataset.entity';
import { DatasetColumn } from '../../entities/dataset-column.entity';
import { db } from '../../lib/db';
import { AppError, notFound } from '../../lib/errors';
import { type AuditEntry, recordAudit } from '../audit/audit.repository';
import { TENURE_FEATURE } from './derive-outcome';
import { buildEngineColumns, type DatasetColumnsForEngine } from './engine-columns';
import type { TypedColumn, TypedTable } from './parsing/type-columns';
import type { PreparedDataset } from './prepare-storage';

const OUTCOME_COLUMN = 'Outcome';

function toSummary(dataset: Dataset): DatasetSummary {
  return {
    id: dataset.id,
    name: dataset.name,
    status: dataset.status,
    rowCount: dataset.rowCount,
    uploadedBy: dataset.uploadedByEmail,
    uploadedAt: dataset.uploadedAt.toISOString(),
  };
}

function toDetail(dataset: Dataset): DatasetDetail {
  return {
    ...toSummary(dataset),
    columns: dataset.profile,
    droppedColumns: dataset.droppedColumns.map((d) => d.name),
    warnings: dataset.warnings,
    sheetName: dataset.sheetName,
    sheetNames: dataset.sheetNames,
    mapping: dataset.mapping,
    preview: dataset.preview,
  };
}

export type NewDataset = {
  name: string;
  format: 'xlsx' | 'csv';
  uploadedBy: { id: string | null; email: string };
  sheetName: string | null;
  sheetNames: string[];
  warnings: string[];
  prepared: PreparedDataset;
};

/** Stores a parsed dataset and its columns in one transaction, with its audit line. */
export async function insertDataset(
  input: NewDataset,
  audit: (id: string) => AuditEntry,
): Promise<DatasetDetail> {
  return db().transaction(async (manager) => {
    const dataset = manager.create(Dataset, {
      name: input.name,
      status: 'profiled',
      rowCount: input.prepared.rowNumbers.length,
      format: input.format,
      uploadedById: input.uploadedBy.id,
      uploadedByEmail: input.uploadedBy.email,
      sheetName: input.sheetName,
      sheetNames: input.sheetNames,
      warnings: input.warnings,
      profile: input.prepared.profile,
      droppedColumns: input.prepared.dropped,
      rowNumbers: input.prepared.rowNumbers,
      mapping: null,
      preview: null,
      mappedAt: null,
    });
    await manager.insert(Dataset, dataset);
    // The values arrive as JSON text and go in as they are. One statement per column: measured
    // faster than one statement carrying all columns' values.
    for (const column of input.prepared.columns) {
      await manager.query(
        `INSERT INTO "dataset_columns" ("dataset_id", "role", "position", "name", "type", "date_order", "values")
         VALUES ($1, 'source', $2, $3, $4, $5, $6::jsonb)`,
        [dataset.id, column.position, column.name, column.type, column.dateOrder, column.valuesJson],
      );
    }
    await recordAudit(audit(dataset.id), manager);
    const saved = await manager.findOneByOrFail(Dataset, { id: dataset.id });
    return toDetail(saved);
  });
}

export async function listDatasets(): Promise<DatasetSummary[]> {
  const datasets = await db()
    .getRepository(Dataset)
    .find({
      select: { id: true, name: true, status: true, rowCount: true, uploadedByEmail: true, uploadedAt: true },
      order: { uploadedAt: 'DESC' },
    });
  return datasets.map(toSummary);
}

export async function findDataset(id: string): Promise<DatasetDetail | null> {
  const dataset = await db().getRepository(Dataset).findOneBy({ id });
  return dataset ? toDetail(dataset) : null;
}

async function loadTable(
  manager: EntityManager,
  id: string,
): Promise<{ dataset: Dataset; table: TypedTable; derived: DatasetColumn[] }> {
  const dataset = await manager
    .getRepository(Dataset)
    .createQueryBuilder('d')
    .addSelect('d.rowNumbers')
    .where('d.id = :id', { id })
    .getOne();
  if (!dataset) throw notFound('The dataset');
  const stored = await manager.getRepository(DatasetColumn).find({
    where: { datasetId: id },
    order: { position: 'ASC' },
  });
  const columns = stored
    .filter((c) => c.role === 'source')
    .map(
      (c) =>
        ({
          name: c.name,
          type: c.type,
          values: c.values,
          dateOrder: c.dateOrder ?? undefined,
        }) as TypedColumn,
    );
  return {
    dataset,
    table: { columns, rowNumbers: dataset.rowNumbers },
    derived: stored.filter((c) => c.role !== 'source'),
  };
}

/** The stored columns as a typed table (file columns only), for the mapping. */
export async function loadTypedTable(
  id: string,
): Promise<{ table: TypedTable; dropped: { name: string; reason: string }[] }> {
  const { dataset, table } = await loadTable(db().manager, id);
  return { table, dropped: dataset.droppedColumns };
}

/**
 * Saves a mapping with its derived values (outcome labels, tenure), deletes the values of the
 * excluded columns, and records the audit line, all in one transaction.
 */
export async function saveMapping(
  id: string,
  input: {
    mapping: DatasetMapping;
    labels: (0 | 1 | null)[];
    tenureMonths: (number | null)[] | null;
    preview: OutcomePreview;
    excludedReason: string;
  },
  audit: AuditEntry,
): Promise<DatasetDetail> {
  return db().transaction(async (manager) => {
    const dataset = await manager.findOne(Dataset, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!dataset) throw notFound('The dataset');
    await manager.delete(DatasetColumn, { datasetId: id, role: 'outcome' });
    await manager.delete(DatasetColumn, { datasetId: id, role: 'derived' });
    const dropped = [...dataset.droppedColumns];
    for (const name of input.mapping.excluded) {
      const result = await manager.delete(DatasetColumn, { datasetId: id, role: 'source', name });
      if ((result.affected ?? 0) > 0) dropped.push({ name, reason: input.excludedReason });
    }
    await manager.insert(DatasetColumn, {
      datasetId: id,
      role: 'outcome',
      position: -1,
      name: OUTCOME_COLUMN,
      type: 'number',
      dateOrder: null,
      values: input.labels,
    });
    if (input.tenureMonths) {
      await manager.insert(DatasetColumn, {
        datasetId: id,
        role: 'derived',
        position: -1,
        name: TENURE_FEATURE,
        type: 'number',
        dateOrder: null,
        values: input.tenureMonths,
      });
    }
    await manager.update(
      Dataset,
      { id },
      {
        status: 'mapped',
        mapping: input.mapping,
        preview: input.preview,
        mappedAt: new Date(),
        droppedColumns: dropped,
      },
    );
    await recordAudit(audit, manager);
    return toDetail(await manager.findOneByOrFail(Dataset, { id }));
  });
}

/** Deletes a dataset; its columns go with it (ON DELETE CASCADE), as does anything else referencing it. */
export async function deleteDataset(id: string, audit: AuditEntry): Promise<boolean> {
  return db().transaction(async (manager) => {
    const result = await manager.delete(Dataset, { id });
    if ((result.affected ?? 0) === 0) return false;
    await recordAudit(audit, manager);
    return true;
  });
}

/**
 * A mapped dataset's columns and labels, ready for the tree engine: only rows with an outcome,
 * no identifiers, no raw dates (tenure and age are derived), grouping columns alongside.
 */
export async function loadDatasetColumns(datasetId: string): Promise<DatasetColumnsForEngine> {
  const { dataset, table, derived } = await loadTable(db().manager, datasetId);
  if (dataset.status !== 'mapped' || !dataset.mapping) {
    throw new AppError('dataset_not_mapped', 409, 'Map the dataset (employee ID, team and outcome) first.');
  }
  const labels = derived.find((c) => c.role === 'outcome')?.values as (0 | 1 | null)[] | undefined;
  if (!labels)
    throw new AppError('dataset_not_mapped', 409, 'Map the dataset (employee ID, team and outcome) first.');
  const tenure = derived.find((c) => c.role === 'derived' && c.name === TENURE_FEATURE)?.values as
    | (number | null)[]
    | undefined;
  return buildEngineColumns({
    datasetId,
    table,
    profile: dataset.profile,
    mapping: dataset.mapping,
    labels,
    tenureMonths: tenure ?? null,
    referenceDate: (dataset.mappedAt ?? dataset.uploadedAt).toISOString().slice(0, 10),
  });
}
