import { AppError } from '../../../lib/errors';

/** A problem with an uploaded file or a mapping; becomes the JSON error of API.md. */
export type IntakeErrorStatus = 400 | 413 | 415 | 422;

export type RowProblem = { row: number; column?: string; reason: string };

/** An AppError the intake raises; the app's error middleware turns it into the JSON error. */
export class IntakeError extends AppError {
  declare readonly status: IntakeErrorStatus;

  constructor(code: string, status: IntakeErrorStatus, message: string, details?: unknown) {
    super(code, status, message, details);
    this.name = 'IntakeError';
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
