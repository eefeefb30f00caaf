import type { ColumnProfile, DatasetMapping } from '../../../../shared/datasets';
import { columnIsoDates, TENURE_FEATURE } from './derive-outcome';
import type { TypedTable } from './parsing/type-columns';

export type EngineFeature = {
  name: string;
  kind: 'numeric' | 'categorical';
  values: (number | null)[] | (string | null)[];
  /** set when the column is (or is derived from) a likely protected characteristic */
  protectedCharacteristic: string | null;
  /** for derived features: the column they come from */
  derivedFrom?: string;
};

/** A mapped dataset, ready for the tree engine: only rows with an outcome, in the stored order. */
export type DatasetColumnsForEngine = {
  datasetId: string;
  rowCount: number;
  /** 1 = the outcome happened (e.g. voluntary exit in the window) */
  labels: (0 | 1)[];
  features: EngineFeature[];
  /** grouping columns for team briefs (not features): values as stored */
  teams: (string | null)[];
  departments: (string | null)[] | null;
  managerEmails: (string | null)[] | null;
  /** keyed hashes of the employee IDs */
  employeeKeys: string[];
};

export const AGE_FEATURE = 'Age (years)';

function yearsBetween(fromIso: string, toIso: string): number {
  return Math.floor((Date.parse(toIso) - Date.parse(fromIso)) / (365.2425 * 86_400_000));
}

/**
 * Turns stored columns, labels and derived values into engine input. Date columns are never used
 * raw: tenure comes from the outcome, and a date of birth becomes age at the window's end (kept
 * flagged as protected so that the privacy policy can block it).
 */
export function buildEngineColumns(input: {
  datasetId: string;
  table: TypedTable;
  profile: ColumnProfile[];
  mapping: DatasetMapping;
  labels: (0 | 1 | null)[];
  tenureMonths: (number | null)[] | null;
  /** reference date for ages when the outcome has no window */
  referenceDate: string;
}): DatasetColumnsForEngine {
  const { table, mapping, labels } = input;
  const keep: number[] = [];
  labels.forEach((label, i) => {
    if (label !== null) keep.push(i);
  });
  const pickRows = <T>(values: T[]): T[] => keep.map((i) => values[i]);
  const column = (name: string | undefined) => table.columns.find((c) => c.name === name);
  const protectedOf = (name: string) =>
    input.profile.find((p) => p.name === name)?.protectedCharacteristic?.characteristic ?? null;

  const { outcome } = mapping;
  const roleColumns = new Set(
    [
      mapping.employeeId,
      mapping.team,
      mapping.managerEmail,
      mapping.managerId,
      ...(outcome.kind === 'exit-dates'
        ? [outcome.startDate, outcome.exitDate, outcome.exitReason]
        : [outcome.column]),
      ...mapping.excluded,
    ].filter((name): name is string => Boolean(name)),
  );
  const referenceDate = outcome.kind === 'exit-dates' ? outcome.windowEnd : input.referenceDate;

  const features: EngineFeature[] = [];
  for (const source of table.columns) {
    if (roleColumns.has(source.name) || source.type === 'identifier' || source.type === 'free-text') continue;
    if (source.type === 'date') {
      if (protectedOf(source.name) !== 'age') continue;
      const dates = columnIsoDates(source, mapping.dateOrder);
      features.push({
        name: AGE_FEATURE,
        kind: 'numeric',
        values: pickRows(dates).map((d) => (d === null ? null : yearsBetween(d, referenceDate))),
        protectedCharacteristic: 'age',
        derivedFrom: source.name,
      });
      continue;
    }
    features.push({
      name: source.name,
      kind: source.type === 'number' ? 'numeric' : 'categorical',
      values: pickRows(source.values as (string | number | null)[]) as (number | null)[] | (string | null)[],
      protectedCharacteristic: protectedOf(source.name),
    });
  }
  if (input.tenureMonths && outcome.kind === 'exit-dates') {
    features.push({
      name: TENURE_FEATURE,
      kind: 'numeric',
      values: pickRows(input.tenureMonths),
      protectedCharacteristic: null,
      derivedFrom: outcome.startDate,
    });
  }

  const textValues = (name: string | undefined) => {
    const found = column(name);
    return found
      ? pickRows(found.values as (string | number | null)[]).map((v) => (v === null ? null : String(v)))
      : null;
  };
  return {
    datasetId: input.datasetId,
    rowCount: keep.length,
    labels: pickRows(labels) as (0 | 1)[],
    features,
    teams: textValues(mapping.team) ?? [],
    departments: textValues(mapping.department),
    managerEmails: textValues(mapping.managerEmail),
    employeeKeys: (textValues(mapping.employeeId) ?? []).map((v) => v ?? ''),
  };
}
