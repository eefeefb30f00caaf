import { afterEach, describe, expect, it, vi } from 'vitest';
import { signOut } from '../../frontend/src/lib/auth';

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('signing out', () => {
  it('posts to /auth/logout with the marker header, then goes home', async () => {
    const fetchMock = vi.fn(async () => new Response(null, { status: 204 }));
    vi.stubGlobal('fetch', fetchMock);
    const assign = vi.spyOn(window.location, 'assign').mockImplementation(() => {});

    await signOut();

    const [url, init] = fetchMock.mock.calls[0] as unknown as [string, RequestInit];
    expect(url).toBe('/auth/logout');
    expect(init.method).toBe('POST');
    expect((init.headers as Record<string, string>)['X-Requested-With']).toBe('coppice');
    expect(assign).toHaveBeenCalledWith('/');
  });

  it('follows the address the server names, e.g. to end the session at the identity provider', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(
        async () =>
          new Response(JSON.stringify({ redirectTo: '/signed-out' }), {
            status: 200,
            headers: { 'Content-Type': 'application/json' },
          }),
      ),
    );
    const assign = vi.spyOn(window.location, 'assign').mockImplementation(() => {});

    await signOut();

    expect(assign).toHaveBeenCalledWith('/signed-out');
  });
});
