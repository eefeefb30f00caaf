import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { routeTable } from '../../../backend/src/lib/route-table';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
beforeAll(async () => {
  coppice = await startTestCoppice();
});
afterAll(async () => {
  await coppice?.stop();
});

// Routes that are public on purpose: everything else under /api must name who may call it.
const PUBLIC = new Set([
  'GET /api/health',
  'GET /auth/login',
  'GET /auth/callback',
  'POST /auth/logout',
  'GET /dev/mailbox',
]);

function concretePath(path: string): string {
  return path.replace(/:[A-Za-z]+/g, '00000000-0000-4000-8000-000000000000');
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

  it('answers 401 to a signed-out caller on every /api route that is not public', async () => {
    const table = routeTable(coppice.app).filter(
      (r) => r.path.startsWith('/api/') && r.access?.kind !== 'public',
    );
    for (const route of table) {
      const res = await request(coppice.app)
        [route.method.toLowerCase() as 'get'](concretePath(route.path))
        .send({});
      expect(res.status, `${route.method} ${route.path}`).toBe(401);
      expect(res.body.error.code).toBe('not_signed_in');
    }
  });

  it('answers 403 to a signed-in caller without the role, before looking at the request', async () => {
    const agents = {
      analyst: await coppice.signIn(ACCOUNTS.analyst),
      privacy_officer: await coppice.signIn(ACCOUNTS.privacy),
      manager: await coppice.signIn(ACCOUNTS.managerNorth),
    };
    const table = routeTable(coppice.app).filter(
      (r) => r.path.startsWith('/api/') && r.access?.kind === 'roles',
    );
    for (const route of table) {
      const roles = route.access?.kind === 'roles' ? route.access.roles : [];
      for (const [role, agent] of Object.entries(agents)) {
        if (roles.includes(role)) continue;
        const res = await agent[route.method.toLowerCase() as 'get'](concretePath(route.path)).send({});
        expect(res.status, `${role} on ${route.method} ${route.path}`).toBe(403);
      }
    }
  });
});
