import type { FieldErrors, Resolver } from 'react-hook-form';
import {
  type ColumnProfile,
  type DatasetDetail,
  type DatasetMapping,
  type DatasetMappingInput,
  datasetMappingSchema,
} from '../../../../../shared/datasets';

/** The mapping form's own flat shape; turned into the API body and checked with the shared schema. */
export type MappingFormValues = {
  employeeId: string;
  team: string;
  department: string;
  managerEmail: string;
  outcomeKind: 'exit-dates' | 'flag';
  startDate: string;
  exitDate: string;
  exitReason: string;
  voluntaryReasons: string[];
  windowStart: string;
  windowEnd: string;
  flagColumn: string;
  positiveValues: string[];
  excluded: string[];
  dateOrder: '' | 'dmy' | 'mdy';
};

// A group of checkboxes with a single option gives a string or false instead of a list.
function list(value: unknown): string[] {
  if (Array.isArray(value)) return value.filter((v): v is string => typeof v === 'string');
  return typeof value === 'string' && value !== '' ? [value] : [];
}

export function toMapping(values: MappingFormValues): DatasetMappingInput {
  const optional = (value: string) => (value === '' ? undefined : value);
  return {
    employeeId: values.employeeId,
    team: values.team,
    department: optional(values.department),
    managerEmail: optional(values.managerEmail),
    outcome:
      values.outcomeKind === 'flag'
        ? { kind: 'flag', column: values.flagColumn, positiveValues: list(values.positiveValues) }
        : {
            kind: 'exit-dates',
            startDate: values.startDate,
            exitDate: values.exitDate,
            exitReason: values.exitReason,
            voluntaryReasons: list(values.voluntaryReasons),
            windowStart: values.windowStart,
            windowEnd: values.windowEnd,
          },
    excluded: list(values.excluded),
    dateOrder: values.dateOrder === '' ? undefined : values.dateOrder,
  };
}

/** The API body when the form is complete, else null. */
export function completeMapping(values: MappingFormValues): DatasetMapping | null {
  const result = datasetMappingSchema.safeParse(toMapping(values));
  return result.success ? result.data : null;
}

const OUTCOME_FIELDS: Record<string, keyof MappingFormValues> = {
  startDate: 'startDate',
  exitDate: 'exitDate',
  exitReason: 'exitReason',
  voluntaryReasons: 'voluntaryReasons',
  windowStart: 'windowStart',
  windowEnd: 'windowEnd',
  column: 'flagColumn',
  positiveValues: 'positiveValues',
};

/** react-hook-form resolver over the shared zod schema, mapping its issue paths to the form's fields. */
export const mappingResolver: Resolver<MappingFormValues> = async (values) => {
  const result = datasetMappingSchema.safeParse(toMapping(values));
  if (result.success) return { values, errors: {} };
  const errors: Record<string, { type: string; message: string }> = {};
  for (const issue of result.error.issues) {
    const [first, second] = issue.path.map(String);
    const field = first === 'outcome' ? (OUTCOME_FIELDS[second] ?? 'outcomeKind') : first;
    if (!errors[field]) errors[field] = { type: issue.code, message: issue.message };
  }
  return { values: {}, errors: errors as FieldErrors<MappingFormValues> };
};

function find(columns: ColumnProfile[], pattern: RegExp, types: ColumnProfile['type'][]): string {
  return columns.find((c) => types.includes(c.type) && pattern.test(c.name))?.name ?? '';
}

function yearBefore(iso: string): string {
  const date = new Date(`${iso}T00:00:00Z`);
  date.setUTCFullYear(date.getUTCFullYear() - 1);
  date.setUTCDate(date.getUTCDate() + 1);
  return date.toISOString().slice(0, 10);
}

function monthEnd(iso: string): string {
  const date = new Date(`${iso.slice(0, 7)}-01T00:00:00Z`);
  date.setUTCMonth(date.getUTCMonth() + 1);
  date.setUTCDate(0);
  return date.toISOString().slice(0, 10);
}

/** Starting values: the saved mapping, or sensible guesses from the column names. */
export function initialValues(dataset: DatasetDetail): MappingFormValues {
  const stored = dataset.columns.filter((c) => !dataset.droppedColumns.includes(c.name));
  const m = dataset.mapping;
  if (m) {
    return {
      employeeId: m.employeeId,
      team: m.team,
      department: m.department ?? '',
      managerEmail: m.managerEmail ?? '',
      outcomeKind: m.outcome.kind,
      startDate: m.outcome.kind === 'exit-dates' ? m.outcome.startDate : '',
      exitDate: m.outcome.kind === 'exit-dates' ? m.outcome.exitDate : '',
      exitReason: m.outcome.kind === 'exit-dates' ? m.outcome.exitReason : '',
      voluntaryReasons: m.outcome.kind === 'exit-dates' ? m.outcome.voluntaryReasons : [],
      windowStart: m.outcome.kind === 'exit-dates' ? m.outcome.windowStart : '',
      windowEnd: m.outcome.kind === 'exit-dates' ? m.outcome.windowEnd : '',
      flagColumn: m.outcome.kind === 'flag' ? m.outcome.column : '',
      positiveValues: m.outcome.kind === 'flag' ? m.outcome.positiveValues : [],
      excluded: m.excluded.filter((name) => stored.some((c) => c.name === name)),
      dateOrder: m.dateOrder ?? '',
    };
  }
  const exitDate = find(stored, /leav|exit|termination|end date/i, ['date']);
  const exitColumn = stored.find((c) => c.name === exitDate);
  const windowEnd = typeof exitColumn?.max === 'string' ? monthEnd(exitColumn.max) : '';
  const reason = find(stored, /reason/i, ['category']);
  const reasonValues = stored.find((c) => c.name === reason)?.topCategories ?? [];
  return {
    employeeId: find(stored, /./, ['identifier']),
    team: find(stored, /team|crew|squad|unit/i, ['category']),
    department: find(stored, /department|dept|depot|division/i, ['category']),
    managerEmail: find(stored, /manager|supervisor/i, ['category', 'identifier']),
    outcomeKind: exitDate ? 'exit-dates' : 'flag',
    startDate: find(stored, /start|hire|join/i, ['date']),
    exitDate,
    exitReason: reason,
    voluntaryReasons: reasonValues.filter((v) => /resign|voluntar/i.test(v.value)).map((v) => v.value),
    windowStart: windowEnd ? yearBefore(windowEnd) : '',
    windowEnd,
    flagColumn: find(stored, /left|leaver|attrition/i, ['yes-no', 'category']),
    positiveValues: [],
    excluded: [],
    dateOrder: '',
  };
}
