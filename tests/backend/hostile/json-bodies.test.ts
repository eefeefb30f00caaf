import fc from 'fast-check';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { routeTable } from '../../../backend/src/lib/route-table';
import { datasetMappingSchema } from '../../../shared/datasets';
import { policyUpdateSchema } from '../../../shared/policy';
import { proxyDecisionSchema } from '../../../shared/privacy';
import { routeKey } from '../../helpers/access-matrix';
import { rowCounts } from '../../helpers/db-snapshot';
import { validCsv } from '../../helpers/hostile-files';
import { arbitraryWrongBody, hostileVariants, prototypeClean } from '../../helpers/hostile-json';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
let privacy: request.Agent;
let analyst: request.Agent;
let datasetId: string;
let reviewedId: string;
beforeAll(async () => {
  coppice = await startTestCoppice();
  privacy = await coppice.signIn(ACCOUNTS.privacy);
  analyst = await coppice.signIn(ACCOUNTS.analyst);
  const uploaded = await analyst.post('/api/datasets').attach('file', Buffer.from(validCsv()), 'staff.csv');
  expect(uploaded.status).toBe(201);
  datasetId = uploaded.body.id;
  // A mapped dataset with a date of birth and one feature, for the proxy decision route.
  const rows = [
    'Staff No,Crew,Line Manager Email,Left,Date of Birth,Overtime',
    ...Array.from(
      { length: 12 },
      (_, i) =>
        `R${i},${i % 2 ? 'North' : 'South'},m@quillfern.example,${i % 3 ? 'No' : 'Yes'},19${60 + i}-05-01,${i}`,
    ),
  ];
  const reviewed = await analyst
    .post('/api/datasets')
    .attach('file', Buffer.from(rows.join('\n')), 'staff.csv');
  expect(reviewed.status).toBe(201);
  reviewedId = reviewed.body.id;
  expect((await analyst.put(`/api/datasets/${reviewedId}/mapping`).send(MAPPING)).status).toBe(200);
});

const MAPPING = {
  employeeId: 'Staff No',
  team: 'Crew',
  managerEmail: 'Line Manager Email',
  outcome: { kind: 'flag', column: 'Left', positiveValues: ['Yes'] },
  excluded: [],
};
afterAll(async () => {
  await coppice?.stop();
});

type BodyRoute = {
  method: 'put' | 'post';
  path: () => string;
  agent: () => request.Agent;
  valid: Record<string, unknown>;
  schema: z.ZodType;
  /** GETs whose answers must be the same before and after a refused request */
  reads: string[];
};

// Every state-changing route that takes a JSON body, with a valid body and what must stay unchanged.
const ROUTES: Record<string, BodyRoute> = {
  'PUT /api/policy': {
    method: 'put',
    path: () => '/api/policy',
    agent: () => privacy,
    valid: {
      k: 6,
      blockedFields: ['Date of Birth'],
      proxyThreshold: 0.5,
      retentionDays: 365,
      reason: 'quarterly review',
    },
    schema: policyUpdateSchema,
    reads: ['/api/policy', '/api/policy/versions'],
  },
  'PUT /api/datasets/:p/mapping': {
    method: 'put',
    path: () => `/api/datasets/${datasetId}/mapping`,
    agent: () => analyst,
    valid: MAPPING,
    schema: datasetMappingSchema,
    reads: [`/api/datasets`, '/api/datasets/:id'],
  },
  'POST /api/datasets/:p/mapping/preview': {
    method: 'post',
    path: () => `/api/datasets/${datasetId}/mapping/preview`,
    agent: () => analyst,
    valid: MAPPING,
    schema: datasetMappingSchema,
    reads: ['/api/datasets/:id'],
  },
  // After the policy above blocks Date of Birth and the mapping above maps the first dataset.
  'POST /api/datasets/:p/proxies/decisions': {
    method: 'post',
    path: () => `/api/datasets/${reviewedId}/proxies/decisions`,
    agent: () => privacy,
    valid: {
      feature: 'Overtime',
      blockedField: 'Date of Birth',
      decision: 'accept',
      reason: 'not a proxy here',
    },
    schema: proxyDecisionSchema,
    reads: ['/api/policy'],
  },
};

// State-changing routes without a JSON body, and why.
const NO_JSON_BODY: Record<string, string> = {
  'POST /api/datasets': 'multipart upload: tests/backend/hostile/uploads.test.ts',
  'DELETE /api/datasets/:p': 'no body',
  'POST /api/datasets/:p/approval':
    'optional body: an empty one approves; its shapes are in tests/backend/review/dataset-review.test.ts',
};

// Refusals because of the body's shape, not because of the product's state.
const SHAPE_ERRORS = ['invalid_body', 'invalid_json', 'too_large'];

async function snapshot(route: BodyRoute) {
  const reads: unknown[] = [];
  for (const path of route.reads) reads.push((await route.agent().get(path.replace(':id', datasetId))).body);
  return { reads, counts: await rowCounts(coppice) };
}

async function send(route: BodyRoute, raw: string) {
  return route.agent()[route.method](route.path()).set('content-type', 'application/json').send(raw);
}

describe('JSON bodies on state-changing routes', () => {
  it('covers every state-changing /api route that takes a body', () => {
    const changing = routeTable(coppice.app).filter(
      (r) => r.path.startsWith('/api/') && ['POST', 'PUT', 'PATCH', 'DELETE'].includes(r.method),
    );
    const uncovered = changing.map(routeKey).filter((key) => !ROUTES[key] && !NO_JSON_BODY[key]);
    expect(uncovered).toEqual([]);
  });

  for (const [key, route] of Object.entries(ROUTES)) {
    describe(key, () => {
      it('accepts the valid body (so the refusals below are about the hostile parts)', async () => {
        expect(route.schema.safeParse(route.valid).success).toBe(true);
      });

      it('refuses wrong types, missing and extra fields, huge values and prototype keys with 400 or 413, changing nothing', async () => {
        const before = await snapshot(route);
        const accepted: string[] = [];
        const isValid = (b: unknown) => route.schema.safeParse(b).success;
        for (const hostile of hostileVariants(route.valid, isValid)) {
          const res = await send(route, hostile.raw);
          const code = res.body?.error?.code;
          if (![400, 413].includes(res.status) || !SHAPE_ERRORS.includes(code))
            accepted.push(`${hostile.label}: ${res.status} ${code}`);
          expect(prototypeClean(), hostile.label).toBe(true);
        }
        expect(accepted).toEqual([]);
        expect(await snapshot(route)).toEqual(before);
      });

      it('refuses arbitrary wrong values that fast-check makes up, changing nothing', async () => {
        const before = await snapshot(route);
        await fc.assert(
          fc.asyncProperty(
            arbitraryWrongBody(route.valid, (b) => route.schema.safeParse(b).success),
            async (raw) => {
              const res = await send(route, raw);
              expect(res.status).toBe(400);
              expect(res.body.error.code).toBe('invalid_body');
            },
          ),
          { numRuns: 60 },
        );
        expect(prototypeClean()).toBe(true);
        expect(await snapshot(route)).toEqual(before);
      });

      it('still takes the valid body afterwards', async () => {
        const res = await send(route, JSON.stringify(route.valid));
        expect(res.status).toBeLessThan(300);
      });
    });
  }
});
