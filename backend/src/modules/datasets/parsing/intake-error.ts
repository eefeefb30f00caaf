/** A problem with an uploaded file or a mapping; becomes the JSON error of API.md. */
export type IntakeErrorStatus = 400 | 413 | 415 | 422;

export type RowProblem = { row: number; column?: string; reason: string };

export class IntakeError extends Error {
  readonly code: string;
  readonly status: IntakeErrorStatus;
  readonly details?: unknown;

  constructor(code: string, status: IntakeErrorStatus, message: string, details?: unknown) {
    super(message);
    this.name = 'IntakeError';
    this.code = code;
    this.status = status;
    this.details = details;
  }
}

export const ROW_PROBLEM_LIMIT = 50;

/** Collects row-level problems; only the first 50 are kept, all are counted. */
export function createRowProblems() {
  const rows: RowProblem[] = [];
  let count = 0;
  return {
    add(problem: RowProblem) {
      count += 1;
      if (rows.length < ROW_PROBLEM_LIMIT) rows.push(problem);
    },
    get count() {
      return count;
    },
    details() {
      return { rows, count };
    },
  };
}

export function isIntakeError(error: unknown): error is IntakeError {
  return error instanceof IntakeError;
}
