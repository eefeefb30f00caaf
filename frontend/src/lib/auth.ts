import { queryOptions, useQuery } from '@tanstack/react-query';
import { type Me, meSchema, type Role } from '../../../shared/roles';
import { api } from './api-client';

export const authKeys = {
  me: ['auth', 'me'] as const,
};

export function getMe(): Promise<Me> {
  return api.get('/api/me', { schema: meSchema });
}

export const meQueryOptions = queryOptions({ queryKey: authKeys.me, queryFn: getMe, staleTime: 5 * 60_000 });

/** The signed-in user; a signed-out browser is sent to sign in by the api-client. */
export function useMe() {
  return useQuery(meQueryOptions);
}

export function hasRole(me: Pick<Me, 'roles'> | undefined, ...roles: Role[]): boolean {
  return !!me && roles.some((role) => me.roles.includes(role));
}

/**
 * Ends the session, then leaves the app. A backend that must also end the session at the identity
 * provider may answer `{ redirectTo }`; a redirect answer or an empty one leads home.
 */
export async function signOut(): Promise<void> {
  let target = '/';
  try {
    const response = await fetch('/auth/logout', {
      method: 'POST',
      credentials: 'same-origin',
      redirect: 'manual',
      headers: { Accept: 'application/json', 'X-Requested-With': 'coppice' },
    });
    if (response.ok && response.headers.get('content-type')?.includes('application/json')) {
      const body = (await response.json()) as { redirectTo?: unknown };
      if (typeof body.redirectTo === 'string') target = body.redirectTo;
    }
  } finally {
    window.location.assign(target);
  }
}
