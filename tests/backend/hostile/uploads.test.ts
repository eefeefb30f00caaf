import fc from 'fast-check';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rowCounts } from '../../helpers/db-snapshot';
import {
  hostileContentFiles,
  malformedFiles,
  smallWorkbook,
  VALID_ROWS,
  validCsv,
} from '../../helpers/hostile-files';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';

// A generous ceiling to catch a hang: a guard that works answers in well under a second or two.
const TIME_LIMIT_MS = 30_000;

let coppice: TestCoppice;
let analyst: request.Agent;
beforeAll(async () => {
  coppice = await startTestCoppice();
  analyst = await coppice.signIn(ACCOUNTS.analyst);
  const first = await upload(validCsv(), 'first.csv');
  expect(first.status).toBe(201);
});
afterAll(async () => {
  await coppice?.stop();
});

async function upload(bytes: Uint8Array, name: string) {
  return analyst.post('/api/datasets').attach('file', Buffer.from(bytes), name);
}

async function state() {
  return { datasets: (await analyst.get('/api/datasets')).body, counts: await rowCounts(coppice) };
}

const BAD_CHARS = /[\p{Cc}\u200E\u200F\u202A-\u202E\u2066-\u2069]/u;

async function expectRefusedAndNothingStored(bytes: Uint8Array, name: string, label: string) {
  const before = await state();
  const started = Date.now();
  const res = await upload(bytes, name);
  const took = Date.now() - started;
  expect(res.status, `${label}: ${res.status} ${res.text.slice(0, 200)}`).toBeGreaterThanOrEqual(400);
  expect(res.status, label).toBeLessThan(500);
  expect(res.type, label).toBe('application/json');
  expect(res.body.error.code, label).toEqual(expect.any(String));
  expect(res.body.error.message, label).toEqual(expect.any(String));
  expect(took, `${label} took ${took} ms`).toBeLessThan(TIME_LIMIT_MS);
  expect((await analyst.get('/api/health')).status, `${label}: server answers`).toBe(200);
  expect(await state(), label).toEqual(before);
}

describe('POST /api/datasets with hostile files', () => {
  for (const file of malformedFiles()) {
    it(`refuses ${file.label} with a 4xx JSON error and stores nothing`, async () => {
      await expectRefusedAndNothingStored(file.bytes, file.name, file.label);
    });
  }

  for (const file of hostileContentFiles()) {
    it(`refuses ${file.label}, or stores it with clean headers`, async () => {
      const before = await state();
      const res = await upload(file.bytes, file.name);
      expect(res.status, file.label).not.toBeGreaterThanOrEqual(500);
      expect((await analyst.get('/api/health')).status).toBe(200);
      if (res.status >= 400) {
        expect(res.body.error.code).toEqual(expect.any(String));
        expect(await state()).toEqual(before);
        return;
      }
      expect(res.status).toBe(201);
      for (const column of res.body.columns as { name: string }[])
        expect(BAD_CHARS.test(column.name), `header ${JSON.stringify(column.name)}`).toBe(false);
      const detail = await analyst.get(`/api/datasets/${res.body.id}`);
      expect(detail.status).toBe(200);
      expect((await analyst.delete(`/api/datasets/${res.body.id}`)).status).toBe(204);
    });
  }

  it('refuses random bytes named .xlsx or .csv (fast-check)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.uint8Array({ minLength: 1, maxLength: 4096 }),
        fc.constantFrom('staff.xlsx', 'staff.csv'),
        async (bytes, name) => {
          // Make sure the bytes are not readable text by chance: a NUL byte in the middle.
          const noisy = bytes.slice();
          noisy[Math.floor(noisy.length / 2)] = 0;
          await expectRefusedAndNothingStored(noisy, name, `${noisy.length} random bytes as ${name}`);
        },
      ),
      { numRuns: 12 },
    );
  });

  it('refuses a workbook cut off at any point (fast-check)', async () => {
    const workbook = smallWorkbook(VALID_ROWS);
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: workbook.length - 23 }), async (cut) => {
        await expectRefusedAndNothingStored(workbook.slice(0, cut), 'staff.xlsx', `workbook cut at ${cut}`);
      }),
      { numRuns: 10 },
    );
  });

  it('still takes a good export afterwards', async () => {
    const res = await upload(validCsv(), 'after.csv');
    expect(res.status).toBe(201);
    expect(res.body.rowCount).toBe(VALID_ROWS.length - 1);
  });
});
