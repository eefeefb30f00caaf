import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type RouteEntry, routeTable } from '../../../backend/src/lib/route-table';
import {
  callRoute,
  concretePath,
  expectedFor,
  PERSONAS,
  type Persona,
  routeKey,
  statusMatches,
} from '../../helpers/access-matrix';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { useDemoRuns, waitForPublication } from '../briefs/demo-sources';

let coppice: TestCoppice;
let agents: Record<Persona, request.Agent>;
beforeAll(async () => {
  coppice = await startTestCoppice();
  agents = {
    'signed-out': request.agent(coppice.app),
    analyst: await coppice.signIn(ACCOUNTS.analyst),
    privacy_officer: await coppice.signIn(ACCOUNTS.privacy),
    manager: await coppice.signIn(ACCOUNTS.managerNorth),
    'other-manager': await coppice.signIn(ACCOUNTS.managerSouth),
  };
  // Published team briefs, so that manager north has teams of their own.
  const demo = await useDemoRuns(agents.analyst, { rows: 400 });
  const run = demo.requestedRun();
  expect((await agents.privacy_officer.post(`/api/models/${run}/publish`).send({})).status).toBe(202);
  expect((await waitForPublication(agents.privacy_officer, run)).status).toBe('published');
}, 120_000);
afterAll(async () => {
  await coppice?.stop();
});

// Routes that are public on purpose: everything else must name who may call it.
const PUBLIC = new Set([
  'GET /api/health',
  'GET /auth/login',
  'GET /auth/callback',
  'POST /auth/logout',
  'GET /dev/mailbox',
]);

// The roles the HTTP contract (API.md) gives each route; a route listed here must carry exactly these.
const CONTRACT: Record<string, string[] | 'signed-in' | 'public'> = {
  'GET /api/health': 'public',
  'GET /api/me': 'signed-in',
  'POST /api/datasets': ['analyst'],
  'GET /api/datasets': ['analyst', 'privacy_officer'],
  'GET /api/datasets/:p': ['analyst', 'privacy_officer'],
  'PUT /api/datasets/:p/mapping': ['analyst'],
  'DELETE /api/datasets/:p': ['analyst', 'privacy_officer'],
  'GET /api/policy': ['analyst', 'privacy_officer'],
  'PUT /api/policy': ['privacy_officer'],
  'GET /api/datasets/:p/proxies': ['analyst', 'privacy_officer'],
  'POST /api/models': ['analyst'],
  'GET /api/models': ['analyst', 'privacy_officer'],
  'GET /api/models/:p': ['analyst', 'privacy_officer'],
  'POST /api/models/:p/publish': ['privacy_officer'],
  'GET /api/teams': ['analyst', 'privacy_officer', 'manager'],
  'GET /api/teams/:p/brief': ['analyst', 'privacy_officer', 'manager'],
  'POST /api/datasets/:p/approval': ['privacy_officer'],
  'POST /api/models/:p/publication-request': ['analyst'],
  'GET /api/audit': ['privacy_officer'],
};

// Routes about one team's data: a manager of another team must be refused (403 or 404).
const TEAM_SCOPED = new Set(['GET /api/teams/:p/brief', 'GET /api/teams/:p/brief.csv']);

// Known gaps, allowed for now with their exact error code: publishing is not wired to model runs
// in this build yet, so a privacy officer's publish answers 503 until it is.
const KNOWN_GAPS: Record<string, string> = { 'POST /api/models/:p/publish': 'model_runs_unavailable' };

function apiRoutes(): RouteEntry[] {
  return routeTable(coppice.app).filter((r) => r.path.startsWith('/api/'));
}

describe('the route table', () => {
  it('gives every route an access rule, and only the known ones are public', () => {
    const table = routeTable(coppice.app).filter((r) => /^\/(api|auth|dev)\//.test(r.path));
    expect(table.length).toBeGreaterThan(3);
    for (const route of table) {
      const key = `${route.method} ${route.path}`;
      expect(route.access, `${key} has no access rule`).not.toBeNull();
      if (route.access?.kind === 'public') expect(PUBLIC.has(key), `${key} is public`).toBe(true);
    }
  });

  it('gives each route of the HTTP contract exactly the roles the contract names', () => {
    for (const route of apiRoutes()) {
      const wanted = CONTRACT[routeKey(route)];
      if (!wanted) continue;
      const rule = route.access;
      const actual =
        rule?.kind === 'roles'
          ? [...rule.roles].sort()
          : rule?.kind === 'signed-in'
            ? 'signed-in'
            : rule?.kind;
      expect(actual, routeKey(route)).toEqual(Array.isArray(wanted) ? [...wanted].sort() : wanted);
    }
  });
});

describe('the authorization matrix: every /api route × signed out, each role and a manager of another team', () => {
  it('signs each persona in with the roles the matrix assumes', async () => {
    expect((await agents['signed-out'].get('/api/me')).status).toBe(401);
    for (const persona of PERSONAS.filter((p) => p !== 'signed-out')) {
      const me = await agents[persona].get('/api/me');
      expect(me.body.roles, persona).toEqual([persona === 'other-manager' ? 'manager' : persona]);
    }
  });

  it('answers 401 signed out, 403 for a wrong role, and lets the right roles past the guard', async () => {
    const failures: string[] = [];
    for (const route of apiRoutes()) {
      if (TEAM_SCOPED.has(routeKey(route))) continue;
      for (const persona of PERSONAS) {
        const expected = expectedFor(route.access!, persona, false);
        const res = await callRoute(agents[persona], route.method, concretePath(route.path));
        const gap = KNOWN_GAPS[routeKey(route)] && res.body?.error?.code === KNOWN_GAPS[routeKey(route)];
        if (!statusMatches(expected, res.status) && !gap)
          failures.push(`${persona} on ${route.method} ${route.path}: ${res.status}, expected ${expected}`);
        if (res.status >= 400 && res.type === 'application/json')
          expect(res.body.error?.code, `${route.method} ${route.path}`).toEqual(expect.any(String));
      }
    }
    expect(failures).toEqual([]);
  });

  it('refuses a manager the brief of a team that is not theirs', async () => {
    const scoped = apiRoutes().filter((r) => TEAM_SCOPED.has(routeKey(r)));
    for (const route of scoped) {
      const teams = await agents.manager.get('/api/teams');
      expect(teams.status).toBe(200);
      const own = (teams.body as { id: string; withheld: boolean }[]).find((t) => !t.withheld)?.id;
      expect(own, 'manager north needs a team with a brief for this check').toBeDefined();
      const path = concretePath(route.path, { id: own! });
      for (const persona of PERSONAS) {
        const res = await callRoute(agents[persona], route.method, path);
        const expected = expectedFor(route.access!, persona, true);
        expect(statusMatches(expected, res.status), `${persona} on ${path}: ${res.status}`).toBe(true);
      }
      expect((await agents.manager.get(path)).status).toBe(200);
    }
  });
});
