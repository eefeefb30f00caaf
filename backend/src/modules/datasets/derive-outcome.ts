import type { DatasetMapping, OutcomePreview } from '../../../../shared/datasets';
import { type DateOrder, monthsBetween, parseDateText, resolveDateText } from './parsing/dates';
import { IntakeError, ROW_PROBLEM_LIMIT, type RowProblem } from './parsing/intake-error';
import type { TypedColumn, TypedTable } from './parsing/type-columns';

export const TENURE_FEATURE = 'Tenure (months)';

export type MappingProblem = { field: string; column?: string; problem: string };

export type DerivedOutcome = {
  /** 1 = the outcome happened (voluntary exit in the window, or the flag's positive value); null = excluded */
  labels: (0 | 1 | null)[];
  /** exit-dates only: months of service at exit for leavers, at the window's end for everyone else */
  tenureMonths: (number | null)[] | null;
  preview: OutcomePreview;
};

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

function findColumn(table: TypedTable, name: string | undefined): TypedColumn | undefined {
  return name === undefined ? undefined : table.columns.find((column) => column.name === name);
}

function mappingError(problems: MappingProblem[]): IntakeError {
  const list = problems.map((p) => (p.column ? `"${p.column}": ${p.problem}` : p.problem)).join('; ');
  return new IntakeError('mapping_invalid', 422, `The mapping cannot be used: ${list}.`, { problems });
}

/** ISO dates of a date column, reading ambiguous numeric forms in the order the mapping gives. */
export function columnIsoDates(column: TypedColumn, dateOrder: DateOrder | undefined): (string | null)[] {
  if (column.type !== 'date') return column.values.map(() => null);
  if (column.dateOrder !== 'ambiguous') return column.values;
  if (!dateOrder) throw new Error(`dateOrder is needed for ${column.name}`);
  return column.values.map((value) => {
    if (value === null) return null;
    const parsed = parseDateText(value);
    return parsed ? resolveDateText(parsed, dateOrder) : null;
  });
}

/** Checks that every column the mapping names exists and suits its role; throws naming each problem. */
export function validateMapping(table: TypedTable, mapping: DatasetMapping): void {
  const problems: MappingProblem[] = [];
  const need = (field: string, name: string | undefined): TypedColumn | undefined => {
    if (name === undefined) return undefined;
    const column = findColumn(table, name);
    if (!column)
      problems.push({ field, column: name, problem: 'there is no column with this name in the dataset' });
    return column;
  };

  const id = need('employeeId', mapping.employeeId);
  if (id && id.type !== 'identifier') {
    problems.push({
      field: 'employeeId',
      column: id.name,
      problem: `is a ${id.type} column, not an identifier; choose the column with one unique ID per employee`,
    });
  }
  for (const field of ['team', 'department', 'managerId'] as const) {
    const column = need(field, mapping[field]);
    if (column?.type === 'date') problems.push({ field, column: column.name, problem: 'is a date column' });
  }
  const manager = need('managerEmail', mapping.managerEmail);
  if (manager) {
    const present = manager.values.filter((v) => v !== null);
    const emails = present.filter((v) => typeof v === 'string' && EMAIL.test(v)).length;
    if (present.length === 0 || emails < 0.9 * present.length) {
      problems.push({
        field: 'managerEmail',
        column: manager.name,
        problem: 'does not hold e-mail addresses',
      });
    }
  }

  const { outcome } = mapping;
  if (outcome.kind === 'exit-dates') {
    for (const field of ['startDate', 'exitDate'] as const) {
      const column = need(`outcome.${field}`, outcome[field]);
      if (column && column.type !== 'date') {
        problems.push({
          field: `outcome.${field}`,
          column: column.name,
          problem: `is a ${column.type} column, not dates`,
        });
      } else if (column?.type === 'date' && column.dateOrder === 'ambiguous' && !mapping.dateOrder) {
        problems.push({
          field: 'dateOrder',
          column: column.name,
          problem:
            'every date fits both day-first and month-first (like 03/04/2025); set dateOrder to "dmy" or "mdy"',
        });
      }
    }
    const reason = need('outcome.exitReason', outcome.exitReason);
    if (reason) {
      const values = new Set(reason.values.filter((v) => v !== null).map(String));
      for (const wanted of outcome.voluntaryReasons) {
        if (!values.has(wanted)) {
          problems.push({
            field: 'outcome.voluntaryReasons',
            column: reason.name,
            problem: `has no value "${wanted}"`,
          });
        }
      }
    }
  } else {
    const flag = need('outcome.column', outcome.column);
    if (flag) {
      const values = new Set(flag.values.filter((v) => v !== null).map(String));
      for (const wanted of outcome.positiveValues) {
        if (!values.has(wanted)) {
          problems.push({
            field: 'outcome.positiveValues',
            column: flag.name,
            problem: `has no value "${wanted}"`,
          });
        }
      }
    }
  }

  const mapped = new Set(
    [
      mapping.employeeId,
      mapping.team,
      mapping.department,
      mapping.managerEmail,
      mapping.managerId,
      ...(outcome.kind === 'exit-dates'
        ? [outcome.startDate, outcome.exitDate, outcome.exitReason]
        : [outcome.column]),
    ].filter((name): name is string => name !== undefined),
  );
  for (const name of mapping.excluded) {
    need('excluded', name);
    if (mapped.has(name))
      problems.push({ field: 'excluded', column: name, problem: 'is mapped above and cannot be excluded' });
  }
  if (problems.length > 0) throw mappingError(problems);

  if (id) checkEmployeeIds(id, table.rowNumbers);
}

function checkEmployeeIds(column: TypedColumn, rowNumbers: number[]): void {
  const missing: RowProblem[] = [];
  const firstRow = new Map<string, number>();
  const duplicates: RowProblem[] = [];
  let duplicateCount = 0;
  column.values.forEach((value, i) => {
    if (value === null) {
      missing.push({ row: rowNumbers[i], column: column.name, reason: 'no employee ID' });
      return;
    }
    const key = String(value);
    const first = firstRow.get(key);
    if (first === undefined) {
      firstRow.set(key, rowNumbers[i]);
      return;
    }
    duplicateCount += 1;
    if (duplicates.length < ROW_PROBLEM_LIMIT) {
      duplicates.push({
        row: rowNumbers[i],
        column: column.name,
        reason: `same ${column.name} as row ${first}`,
      });
    }
  });
  if (missing.length > 0) {
    throw new IntakeError(
      'employee_id_missing',
      422,
      `${missing.length} row(s) have no ${column.name}. Every row needs an employee ID; fix the export and upload again.`,
      { rows: missing.slice(0, ROW_PROBLEM_LIMIT), count: missing.length },
    );
  }
  if (duplicateCount > 0) {
    throw new IntakeError(
      'duplicate_employee_ids',
      422,
      `${duplicateCount} row(s) repeat an employee ID in "${column.name}" (rows ${duplicates
        .slice(0, 10)
        .map((d) => d.row)
        .join(
          ', ',
        )}${duplicateCount > 10 ? ', …' : ''}). Each employee must appear once; fix the export and upload again.`,
      { rows: duplicates, count: duplicateCount },
    );
  }
}

function round(value: number, digits: number): number {
  const factor = 10 ** digits;
  return Math.round(value * factor) / factor;
}

/**
 * Per-row outcome labels, excluded rows with reasons, tenure and the preview counts.
 * Attrition rate = leavers in the window ÷ average of the headcounts at its start and end × 100
 * (common practice, no single standard; separations rate in US BLS JOLTS is the same idea).
 */
export function deriveOutcome(table: TypedTable, mapping: DatasetMapping): DerivedOutcome {
  validateMapping(table, mapping);
  const rows = table.rowNumbers.length;
  const labels: (0 | 1 | null)[] = new Array(rows).fill(null);
  const excludedRows: { row: number; reason: string }[] = [];
  const reasonCounts = new Map<string, number>();
  const exclude = (i: number, reason: string) => {
    labels[i] = null;
    reasonCounts.set(reason, (reasonCounts.get(reason) ?? 0) + 1);
    if (excludedRows.length < ROW_PROBLEM_LIMIT) excludedRows.push({ row: table.rowNumbers[i], reason });
  };
  const excludedSummary = () => ({
    count: [...reasonCounts.values()].reduce((a, b) => a + b, 0),
    reasons: [...reasonCounts.entries()]
      .map(([reason, count]) => ({ reason, count }))
      .sort((a, b) => b.count - a.count),
    rows: excludedRows,
  });

  const { outcome } = mapping;
  if (outcome.kind === 'flag') {
    const column = findColumn(table, outcome.column)!;
    const positive = new Set(outcome.positiveValues);
    let positives = 0;
    column.values.forEach((value, i) => {
      if (value === null) {
        exclude(i, `no value in ${column.name}`);
        return;
      }
      labels[i] = positive.has(String(value)) ? 1 : 0;
      positives += labels[i]!;
    });
    const included = labels.filter((label) => label !== null).length;
    return {
      labels,
      tenureMonths: null,
      preview: {
        kind: 'flag',
        included,
        headcountStart: null,
        headcountEnd: null,
        leaversVoluntary: positives,
        leaversOther: 0,
        attritionRate: included === 0 ? null : round((positives / included) * 100, 2),
        voluntaryAttritionRate: included === 0 ? null : round((positives / included) * 100, 2),
        excluded: excludedSummary(),
      },
    };
  }

  const starts = columnIsoDates(findColumn(table, outcome.startDate)!, mapping.dateOrder);
  const exits = columnIsoDates(findColumn(table, outcome.exitDate)!, mapping.dateOrder);
  const reasons = findColumn(table, outcome.exitReason)!.values;
  const voluntary = new Set(outcome.voluntaryReasons);
  const { windowStart, windowEnd } = outcome;
  const tenureMonths: (number | null)[] = new Array(rows).fill(null);
  let headcountStart = 0;
  let headcountEnd = 0;
  let leaversVoluntary = 0;
  let leaversOther = 0;

  for (let i = 0; i < rows; i += 1) {
    const start = starts[i];
    const exit = exits[i];
    if (start === null) {
      exclude(i, `no ${outcome.startDate}`);
      continue;
    }
    if (exit !== null && exit < start) {
      exclude(i, `${outcome.exitDate} is before ${outcome.startDate}`);
      continue;
    }
    if (start > windowEnd) {
      exclude(i, 'started after the window ended');
      continue;
    }
    if (exit !== null && exit < windowStart) {
      exclude(i, 'left before the window began');
      continue;
    }
    // An exit date is the last day of employment: someone leaving on the window's first day was there.
    if (start <= windowStart) headcountStart += 1;
    const leftInWindow = exit !== null && exit <= windowEnd;
    if (!leftInWindow) {
      headcountEnd += 1;
      labels[i] = 0;
      tenureMonths[i] = round(monthsBetween(start, windowEnd), 1);
      continue;
    }
    const reason = reasons[i];
    const isVoluntary = reason !== null && voluntary.has(String(reason));
    if (isVoluntary) leaversVoluntary += 1;
    else leaversOther += 1;
    if (reason === null) {
      exclude(i, `left in the window with no ${outcome.exitReason}`);
      continue;
    }
    labels[i] = isVoluntary ? 1 : 0;
    tenureMonths[i] = round(monthsBetween(start, exit), 1);
  }

  const averageHeadcount = (headcountStart + headcountEnd) / 2;
  const rate = (leavers: number) =>
    averageHeadcount === 0 ? null : round((leavers / averageHeadcount) * 100, 2);
  return {
    labels,
    tenureMonths,
    preview: {
      kind: 'exit-dates',
      included: labels.filter((label) => label !== null).length,
      headcountStart,
      headcountEnd,
      leaversVoluntary,
      leaversOther,
      attritionRate: rate(leaversVoluntary + leaversOther),
      voluntaryAttritionRate: rate(leaversVoluntary),
      excluded: excludedSummary(),
    },
  };
}
