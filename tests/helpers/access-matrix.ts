import type request from 'supertest';
import type { AccessRule, RouteEntry } from '../../backend/src/lib/route-table';

/** Who knocks: signed out, one of each role, and a manager whose teams are not the ones asked about. */
export type Persona = 'signed-out' | 'analyst' | 'privacy_officer' | 'manager' | 'other-manager';
export const PERSONAS: Persona[] = ['signed-out', 'analyst', 'privacy_officer', 'manager', 'other-manager'];

const ROLE_OF: Record<Persona, string | null> = {
  'signed-out': null,
  analyst: 'analyst',
  privacy_officer: 'privacy_officer',
  manager: 'manager',
  'other-manager': 'manager',
};

/** What the matrix expects: refused with 401 or 403, refused as not yours (403 or 404), or let through. */
export type Expected = 'unauthenticated' | 'forbidden' | 'not-yours' | 'allowed';

/**
 * The expected answer for one persona on one route. `teamScoped` routes are about one team's data:
 * a manager of another team is refused even though the role fits.
 */
export function expectedFor(rule: AccessRule, persona: Persona, teamScoped: boolean): Expected {
  if (rule.kind === 'public') return 'allowed';
  if (persona === 'signed-out') return 'unauthenticated';
  if (rule.kind === 'signed-in') return 'allowed';
  const role = ROLE_OF[persona];
  if (!role || !rule.roles.includes(role)) return 'forbidden';
  if (persona === 'other-manager' && teamScoped) return 'not-yours';
  return 'allowed';
}

export function statusMatches(expected: Expected, status: number): boolean {
  if (expected === 'unauthenticated') return status === 401;
  if (expected === 'forbidden') return status === 403;
  if (expected === 'not-yours') return status === 403 || status === 404;
  // Let through: the guard passed; the route may still say 400/404/409 about the made-up request,
  // but never 401/403, and never a crash.
  return status !== 401 && status !== 403 && status < 500;
}

/** A route key with parameter names dropped, so `:id` and `:datasetId` compare equal. */
export function routeKey(route: Pick<RouteEntry, 'method' | 'path'>): string {
  return `${route.method} ${route.path.replace(/:[A-Za-z0-9_]+/g, ':p')}`;
}

export function concretePath(path: string, params: Record<string, string> = {}): string {
  return path.replace(/:([A-Za-z0-9_]+)/g, (_m, name: string) => params[name] ?? NO_SUCH_ID);
}

export const NO_SUCH_ID = '00000000-0000-4000-8000-000000000000';

export async function callRoute(
  agent: request.Agent,
  method: string,
  path: string,
): Promise<request.Response> {
  const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  if (m === 'get' || m === 'delete') return agent[m](path);
  return agent[m](path).send({});
}
