import type { ErrorRequestHandler, RequestHandler } from 'express';
import { z } from 'zod';
import { db } from './db';
import { logger } from './logger';

/** A failure a person can act on: `code` for programs, `message` for people, the HTTP status of API.md. */
export class AppError extends Error {
  constructor(
    public readonly code: string,
    public readonly status: number,
    message: string,
    public readonly details?: unknown,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details?: unknown) =>
  new AppError('bad_request', 400, message, details);
export const notFound = (what: string) => new AppError('not_found', 404, `${what} was not found.`);
export const forbidden = (message = 'Your role does not allow this.') =>
  new AppError('forbidden', 403, message);
export const conflict = (message: string, details?: unknown) =>
  new AppError('conflict', 409, message, details);

/** Errors from the database driver that mean PostgreSQL cannot be reached right now. */
export function isDatabaseDown(error: unknown): boolean {
  const outer = error as { code?: string; message?: string; driverError?: unknown } | undefined;
  if (!outer) return false;
  // TypeORM wraps the driver's error; look at both.
  if (outer.driverError && outer.driverError !== error && isDatabaseDown(outer.driverError)) return true;
  const e = outer;
  const codes = [
    'ECONNREFUSED',
    'ECONNRESET',
    'ETIMEDOUT',
    'EPIPE',
    '57P01',
    '57P02',
    '57P03',
    '08006',
    '08001',
    '08003',
  ];
  if (e.code && codes.includes(e.code)) return true;
  const message = e.message ?? '';
  return /Connection terminated|connect ECONNREFUSED|the database system is (shutting down|starting up)|terminating connection|not queryable|server closed the connection|connection timeout|timeout exceeded when trying to connect/i.test(
    message,
  );
}

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new AppError('not_found', 404, `No route for ${req.method} ${req.path}.`));
};

/** Whether PostgreSQL answers a trivial query within a second. */
async function databaseAnswers(): Promise<boolean> {
  try {
    await Promise.race([
      db().query('SELECT 1'),
      new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 1000)),
    ]);
    return true;
  } catch {
    return false;
  }
}

const DATABASE_UNAVAILABLE = {
  code: 'database_unavailable',
  message: 'The database is not reachable right now. Nothing was changed; please try again in a minute.',
};

export const errorHandler: ErrorRequestHandler = async (err, req, res, _next) => {
  let status = 500;
  let body: { code: string; message: string; details?: unknown };
  if (err instanceof AppError) {
    status = err.status;
    body = { code: err.code, message: err.message, details: err.details };
  } else if (err instanceof z.ZodError) {
    status = 400;
    body = {
      code: 'invalid_body',
      message: 'The request is not valid; see details for each field.',
      details: err.issues.map((i) => ({ path: i.path.join('.'), message: i.message })),
    };
  } else if (err?.type === 'entity.too.large') {
    status = 413;
    body = { code: 'too_large', message: 'The request body is too large.' };
  } else if (err?.type === 'entity.parse.failed') {
    status = 400;
    body = { code: 'invalid_json', message: 'The request body is not valid JSON.' };
  } else if (isDatabaseDown(err) || !(await databaseAnswers())) {
    // An outage can surface as an error of any shape from a driver or the ORM: when PostgreSQL
    // does not answer either, the outage is what the person needs to hear about.
    status = 503;
    body = DATABASE_UNAVAILABLE;
  } else {
    body = {
      code: 'internal',
      message: 'Something went wrong on our side. It has been logged; please try again.',
    };
  }
  if (status >= 500) logger.error({ err, reqId: req.id, path: req.path }, 'request failed');
  if (res.headersSent) return;
  res.status(status).json({ error: body });
};
