import type { ZodType } from 'zod';
import { apiErrorSchema } from '../../../shared/errors';
import { paths } from '../config/paths';

/** A failed API call, carrying the `{ error: { code, message, details } }` body of API.md. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;

  constructor(status: number, code: string, message: string, details?: unknown) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

export type ApiRequestOptions<T> = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** sent as JSON, or as multipart when it is FormData */
  body?: unknown;
  /** checks the response body; without it the body is trusted as T */
  schema?: ZodType<T>;
  signal?: AbortSignal;
};

/** Sends the browser to sign in and back to the page it is on. */
export function redirectToSignIn(): void {
  const here = window.location.pathname + window.location.search + window.location.hash;
  window.location.assign(paths.signIn.href(here));
}

export async function toApiError(response: Response): Promise<ApiError> {
  let body: unknown;
  try {
    body = await response.json();
  } catch {
    body = undefined;
  }
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) {
    const { code, message, details } = parsed.data.error;
    return new ApiError(response.status, code, message, details);
  }
  return new ApiError(response.status, 'http_error', `The server answered with status ${response.status}.`);
}

/** The one way the frontend talks to the API. */
export async function apiRequest<T>(path: string, options: ApiRequestOptions<T> = {}): Promise<T> {
  const { method = 'GET', body, schema, signal } = options;
  // The backend checks Origin on state-changing requests; the header marks our own client as well.
  const headers: Record<string, string> = { Accept: 'application/json', 'X-Requested-With': 'coppice' };
  let payload: BodyInit | undefined;
  if (body instanceof FormData) {
    payload = body;
  } else if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    payload = JSON.stringify(body);
  }

  let response: Response;
  try {
    response = await fetch(path, { method, headers, body: payload, signal, credentials: 'same-origin' });
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiError(
      0,
      'network_error',
      'Coppice could not reach the server. Check the connection and try again.',
    );
  }

  if (!response.ok) {
    const error = await toApiError(response);
    if (response.status === 401) redirectToSignIn();
    throw error;
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  const data: unknown = text === '' ? undefined : JSON.parse(text);
  return schema ? schema.parse(data) : (data as T);
}

export const api = {
  get: <T>(path: string, options?: Omit<ApiRequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'GET' }),
  post: <T>(path: string, body?: unknown, options?: Omit<ApiRequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'POST', body }),
  put: <T>(path: string, body?: unknown, options?: Omit<ApiRequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'PUT', body }),
  delete: <T>(path: string, options?: Omit<ApiRequestOptions<T>, 'method' | 'body'>) =>
    apiRequest<T>(path, { ...options, method: 'DELETE' }),
};
