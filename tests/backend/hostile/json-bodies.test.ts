import fc from 'fast-check';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { routeTable } from '../../../backend/src/lib/route-table';
import { publishBodySchema } from '../../../shared/briefs';
import { datasetMappingSchema } from '../../../shared/datasets';
import {
  driverActionSchema,
  modelRunRequestSchema,
  publicationRequestSchema,
  sendBackSchema,
} from '../../../shared/models';
import { policyUpdateSchema } from '../../../shared/policy';
import { approvalSchema, proxyDecisionSchema } from '../../../shared/privacy';
import { routeKey } from '../../helpers/access-matrix';
import { rowCounts } from '../../helpers/db-snapshot';
import { validCsv } from '../../helpers/hostile-files';
import { arbitraryWrongBody, hostileVariants, prototypeClean } from '../../helpers/hostile-json';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

let coppice: TestCoppice;
let privacy: request.Agent;
let analyst: request.Agent;
let datasetId: string;
beforeAll(async () => {
  coppice = await startTestCoppice();
  privacy = await coppice.signIn(ACCOUNTS.privacy);
  analyst = await coppice.signIn(ACCOUNTS.analyst);
  const uploaded = await analyst.post('/api/datasets').attach('file', Buffer.from(validCsv()), 'staff.csv');
  expect(uploaded.status).toBe(201);
  datasetId = uploaded.body.id;
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
  /** the valid body passes validation; with a made-up id the route then says 404 or 409 */
  validPasses?: (status: number) => boolean;
};

const PAST_VALIDATION = (status: number) => status !== 400 && status < 500;
const MODEL = '00000000-0000-4000-8000-000000000000';

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
  'POST /api/datasets/:p/proxies/decisions': {
    method: 'post',
    path: () => `/api/datasets/${datasetId}/proxies/decisions`,
    agent: () => privacy,
    valid: { feature: 'Crew', blockedField: 'Left', decision: 'accept', reason: 'not a proxy here' },
    schema: proxyDecisionSchema,
    reads: ['/api/datasets/:id/proxies', '/api/datasets/:id/approval'],
    validPasses: PAST_VALIDATION,
  },
  'POST /api/datasets/:p/approval': {
    method: 'post',
    path: () => `/api/datasets/${datasetId}/approval`,
    agent: () => privacy,
    valid: { decision: 'send-back', comment: 'map the outcome first' },
    schema: approvalSchema,
    reads: ['/api/datasets/:id/approval', '/api/datasets/:id'],
    validPasses: PAST_VALIDATION,
  },
  'POST /api/models': {
    method: 'post',
    path: () => '/api/models',
    agent: () => analyst,
    valid: { datasetId: MODEL, criterion: 'entropy', maxDepth: 4, minLeaf: 10, features: ['Crew'] },
    schema: modelRunRequestSchema,
    reads: ['/api/models'],
    validPasses: PAST_VALIDATION,
  },
  'PUT /api/models/:p/drivers/:p/action': {
    method: 'put',
    path: () => `/api/models/${MODEL}/drivers/Crew/action`,
    agent: () => analyst,
    valid: { text: 'Ask the crew about rotas' },
    schema: driverActionSchema,
    reads: ['/api/models'],
    validPasses: PAST_VALIDATION,
  },
  'POST /api/models/:p/publication-request': {
    method: 'post',
    path: () => `/api/models/${MODEL}/publication-request`,
    agent: () => analyst,
    valid: { comment: 'ready for review' },
    schema: publicationRequestSchema,
    reads: ['/api/models'],
    validPasses: PAST_VALIDATION,
  },
  'POST /api/models/:p/send-back': {
    method: 'post',
    path: () => `/api/models/${MODEL}/send-back`,
    agent: () => privacy,
    valid: { comment: 'needs a larger k' },
    schema: sendBackSchema,
    reads: ['/api/models'],
    validPasses: PAST_VALIDATION,
  },
  'POST /api/models/:p/publish': {
    method: 'post',
    path: () => `/api/models/${MODEL}/publish`,
    agent: () => privacy,
    valid: { comment: 'agreed with the works council' },
    schema: publishBodySchema,
    reads: ['/api/models'],
    // Past validation a made-up run is 404 (503 while publishing is not wired to model runs).
    validPasses: (status) => status === 404 || status === 503,
  },
};

// State-changing routes without a JSON body, and why.
const NO_JSON_BODY: Record<string, string> = {
  'POST /api/datasets': 'multipart upload: tests/backend/hostile/uploads.test.ts',
  'DELETE /api/datasets/:p': 'no body',
  'POST /api/models/:p/cancel': 'no body',
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
        if (route.validPasses) expect(route.validPasses(res.status), `${res.status} ${res.text}`).toBe(true);
        else expect(res.status).toBeLessThan(300);
      });
    });
  }
});
