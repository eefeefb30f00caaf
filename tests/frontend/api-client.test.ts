import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiRequest } from '../../frontend/src/lib/api-client';

function answer(status: number, body: unknown) {
  return vi.fn(
    async () =>
      new Response(typeof body === 'string' ? body : JSON.stringify(body), {
        status,
        headers: { 'Content-Type': typeof body === 'string' ? 'text/html' : 'application/json' },
      }),
  );
}

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('the api client', () => {
  it('turns the JSON error body into an ApiError with status, code, message and details', async () => {
    const details = [{ row: 14, message: 'Start Date is not a date' }];
    vi.stubGlobal(
      'fetch',
      answer(422, { error: { code: 'unusable_rows', message: 'Two rows cannot be read', details } }),
    );

    const error = await apiRequest('/api/datasets', { method: 'POST', body: {} }).catch((e: unknown) => e);

    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 422,
      code: 'unusable_rows',
      message: 'Two rows cannot be read',
      details,
    });
  });

  it('still gives an ApiError when the server answers with something that is not our error body', async () => {
    vi.stubGlobal('fetch', answer(502, '<html>Bad gateway</html>'));
    const error = await apiRequest('/api/teams').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 502, code: 'http_error' });
  });

  it('sends JSON with the marker header and returns the parsed answer', async () => {
    const fetchMock = answer(202, { id: 'm1', status: 'queued' });
    vi.stubGlobal('fetch', fetchMock);

    const result = await apiRequest<{ id: string }>('/api/models', {
      method: 'POST',
      body: { datasetId: 'd1' },
    });

    expect(result).toEqual({ id: 'm1', status: 'queued' });
    const [, init] = fetchMock.mock.calls[0] as unknown as [string, RequestInit];
    const headers = init.headers as Record<string, string>;
    expect(headers['X-Requested-With']).toBe('coppice');
    expect(headers['Content-Type']).toBe('application/json');
    expect(init.body).toBe(JSON.stringify({ datasetId: 'd1' }));
  });

  it('sends a signed-out browser to sign in and back to the page it was on', async () => {
    vi.stubGlobal('fetch', answer(401, { error: { code: 'unauthenticated', message: 'Please sign in' } }));
    window.history.replaceState(null, '', '/models/7?tab=tree');
    const assign = vi.spyOn(window.location, 'assign').mockImplementation(() => {});

    const error = await apiRequest('/api/me').catch((e: unknown) => e);

    expect(error).toMatchObject({ status: 401 });
    expect(assign).toHaveBeenCalledWith('/auth/login?returnTo=%2Fmodels%2F7%3Ftab%3Dtree');
  });
});
