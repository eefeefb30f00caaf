import type {
  DatasetDetail,
  DatasetMapping,
  DatasetSummary,
  OutcomePreview,
} from '../../../../shared/datasets';
import type { Config } from '../../lib/config';
import { notFound } from '../../lib/errors';
import { logger } from '../../lib/logger';
import type { SessionUser } from '../auth/session-types';
import {
  deleteDataset as deleteStoredDataset,
  findDataset,
  insertDataset,
  listDatasets as listStoredDatasets,
  loadTypedTable,
  saveMapping,
} from './datasets.repository';
import { deriveOutcome, type MappingProblem } from './derive-outcome';
import type { IntakeLimits } from './parsing/build-table';
import { IntakeError } from './parsing/intake-error';
import { readUpload } from './run-intake';

type Actor = { id: string | null; email: string };

function actorOf(user: SessionUser | Actor): Actor {
  return { id: user.id, email: user.email };
}

export function datasetNameFrom(fileName: string | undefined, given: string | undefined): string {
  const name = (given?.trim() || fileName?.replace(/\.(xlsx|csv|txt)$/i, '').trim() || 'Staff export').slice(
    0,
    200,
  );
  return name.replace(/\p{Cc}/gu, ' ');
}

/**
 * Parses, profiles and stores an upload: accepted whole or rejected whole. Direct identifiers and
 * free text are dropped, employee IDs are hashed with the server secret, and the bytes themselves
 * are never stored.
 */
export async function uploadDataset(input: {
  bytes: Uint8Array;
  fileName?: string;
  name?: string;
  sheet?: string;
  user: SessionUser | Actor;
  config: Pick<Config, 'employeeIdSecret'>;
  limits?: Partial<IntakeLimits>;
}): Promise<DatasetDetail> {
  const started = performance.now();
  const parsed = await readUpload({
    bytes: input.bytes,
    sheet: input.sheet || undefined,
    limits: input.limits,
    secret: input.config.employeeIdSecret,
    // The upload's bytes are not needed after reading: a workbook's move to the reader.
    handOverBytes: true,
  });
  const { prepared } = parsed;
  const preparedAt = performance.now();
  const actor = actorOf(input.user);
  const dataset = await insertDataset(
    {
      name: datasetNameFrom(input.fileName, input.name),
      format: parsed.format,
      uploadedBy: actor,
      sheetName: parsed.sheetName,
      sheetNames: parsed.sheetNames,
      warnings: parsed.warnings,
      prepared,
    },
    (id) => ({
      actor: actor.id ? { id: actor.id, email: actor.email } : null,
      action: 'dataset.uploaded',
      objectType: 'dataset',
      objectId: id,
      details: {
        format: parsed.format,
        rows: prepared.rowNumbers.length,
        columns: parsed.columnCount,
        dropped: prepared.dropped.map((d) => d.name),
      },
    }),
  );
  logger.info(
    {
      datasetId: dataset.id,
      rows: dataset.rowCount,
      format: parsed.format,
      ms: {
        read: Math.round(preparedAt - started),
        store: Math.round(performance.now() - preparedAt),
      },
    },
    'dataset stored',
  );
  return dataset;
}

export const listDatasets = (): Promise<DatasetSummary[]> => listStoredDatasets();

export async function getDataset(id: string): Promise<DatasetDetail> {
  const dataset = await findDataset(id);
  if (!dataset) throw notFound('The dataset');
  return dataset;
}

async function derive(id: string, mapping: DatasetMapping) {
  const { table, dropped } = await loadTypedTable(id);
  const gone = new Map(dropped.map((d) => [d.name, d.reason]));
  const roles: [string, string | undefined][] = [
    ['employeeId', mapping.employeeId],
    ['team', mapping.team],
    ['department', mapping.department],
    ['managerEmail', mapping.managerEmail],
    ['managerId', mapping.managerId],
    ...(mapping.outcome.kind === 'exit-dates'
      ? ([
          ['outcome.startDate', mapping.outcome.startDate],
          ['outcome.exitDate', mapping.outcome.exitDate],
          ['outcome.exitReason', mapping.outcome.exitReason],
        ] as [string, string][])
      : ([['outcome.column', mapping.outcome.column]] as [string, string][])),
  ];
  const problems: MappingProblem[] = roles
    .filter(([, name]) => name !== undefined && gone.has(name))
    .map(([field, name]) => ({
      field,
      column: name,
      problem: `was not stored (${gone.get(name as string)}); choose another column or upload the file again`,
    }));
  if (problems.length > 0) {
    const list = problems.map((p) => `"${p.column}": ${p.problem}`).join('; ');
    throw new IntakeError('mapping_invalid', 422, `The mapping cannot be used: ${list}.`, { problems });
  }
  // Columns dropped at upload (or excluded earlier) have nothing left to exclude.
  const forTable = { ...mapping, excluded: mapping.excluded.filter((name) => !gone.has(name)) };
  return deriveOutcome(table, forTable);
}

/** The outcome counts a mapping would give, without saving it (the form's live preview). */
export async function previewMapping(id: string, mapping: DatasetMapping): Promise<OutcomePreview> {
  return (await derive(id, mapping)).preview;
}

export async function mapDataset(
  id: string,
  mapping: DatasetMapping,
  user: SessionUser | Actor,
): Promise<DatasetDetail> {
  const derived = await derive(id, mapping);
  const actor = actorOf(user);
  return saveMapping(
    id,
    {
      mapping,
      labels: derived.labels,
      tenureMonths: derived.tenureMonths,
      preview: derived.preview,
      excludedReason: 'excluded by the mapping; its values were deleted',
    },
    {
      actor: actor.id ? { id: actor.id, email: actor.email } : null,
      action: 'dataset.mapped',
      objectType: 'dataset',
      objectId: id,
      details: {
        employeeId: mapping.employeeId,
        team: mapping.team,
        department: mapping.department ?? null,
        outcome: mapping.outcome,
        excluded: mapping.excluded,
        included: derived.preview.included,
        excludedRows: derived.preview.excluded.count,
      },
    },
  );
}

export async function deleteDataset(id: string, user: SessionUser): Promise<void> {
  const dataset = await findDataset(id);
  if (!dataset) throw notFound('The dataset');
  const deleted = await deleteStoredDataset(id, {
    actor: { id: user.id, email: user.email },
    action: 'dataset.deleted',
    objectType: 'dataset',
    objectId: id,
    details: { name: dataset.name, rows: dataset.rowCount },
  });
  if (!deleted) throw notFound('The dataset');
}
