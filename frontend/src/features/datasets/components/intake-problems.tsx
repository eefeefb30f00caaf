import { isApiError } from '../../../lib/api-client';

type RowProblem = { row: number; column?: string; reason: string };
type HeaderProblem = { column: string; position: number; name: string; reason: string };
type MappingProblem = { field: string; column?: string; problem: string };

export type IntakeProblemsProps = {
  error: unknown;
  /** what failed, in the analyst's words */
  title: string;
};

function asArray<T>(value: unknown): T[] {
  return Array.isArray(value) ? (value as T[]) : [];
}

/**
 * An upload or mapping error in place: the message says what to do, and the rows (first 50 and the
 * total), header columns or mapping fields are listed so that the analyst can fix the export.
 */
export function IntakeProblems({ error, title }: IntakeProblemsProps) {
  const message = error instanceof Error ? error.message : 'An unexpected error occurred.';
  const details =
    isApiError(error) && error.details && typeof error.details === 'object' ? error.details : {};
  const d = details as {
    rows?: unknown;
    count?: unknown;
    columns?: unknown;
    problems?: unknown;
    ranges?: unknown;
  };
  const rows = asArray<RowProblem>(d.rows);
  const columns = asArray<HeaderProblem>(d.columns);
  const problems = asArray<MappingProblem>(d.problems);
  const count = typeof d.count === 'number' ? d.count : rows.length;
  return (
    <div
      role="alert"
      className="rounded-md border border-signal-200 bg-signal-50 px-4 py-3 text-sm text-slate-900"
    >
      <p className="font-semibold text-signal-700">{title}</p>
      <p className="mt-1">{message}</p>
      {rows.length > 0 && (
        <div className="mt-3 max-h-72 overflow-auto rounded border border-signal-100 bg-white">
          <table className="w-full text-left text-sm">
            <caption className="px-3 py-1 text-left text-xs text-slate-600">
              {count > rows.length ? `The first ${rows.length} of ${count} problems` : `${count} problem(s)`}
            </caption>
            <thead className="bg-sand-100">
              <tr>
                <th scope="col" className="px-3 py-1">
                  Row
                </th>
                <th scope="col" className="px-3 py-1">
                  Column
                </th>
                <th scope="col" className="px-3 py-1">
                  Problem
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((row, i) => (
                // biome-ignore lint/suspicious/noArrayIndexKey: a row may have several problems; the list never reorders
                <tr key={i} className="border-t border-sand-100">
                  <td className="px-3 py-1 tabular-nums">{row.row}</td>
                  <td className="px-3 py-1">{row.column ?? '–'}</td>
                  <td className="px-3 py-1">{row.reason}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {columns.length > 0 && (
        <ul className="mt-2 list-disc space-y-0.5 pl-5">
          {columns.map((column) => (
            <li key={`${column.column}-${column.reason}`}>
              Column {column.column}
              {column.name ? ` (“${column.name.slice(0, 40)}”)` : ''}: {column.reason}
            </li>
          ))}
        </ul>
      )}
      {problems.length > 0 && (
        <ul className="mt-2 list-disc space-y-0.5 pl-5">
          {problems.map((problem) => (
            <li key={`${problem.field}-${problem.column}-${problem.problem}`}>
              {problem.column ? `“${problem.column}” ` : ''}
              {problem.problem}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
