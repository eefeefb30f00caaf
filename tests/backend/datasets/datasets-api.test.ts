import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateQuillfernExport, QUILLFERN_MAPPING } from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import { quillfernXlsx } from '../../../backend/src/demo/quillfern-xlsx';
import { DEMO_DATASET_NAME, seedDemoDataset } from '../../../backend/src/demo/seed-demo-dataset';
import { loadDatasetColumns } from '../../../backend/src/modules/datasets/datasets.repository';
import { ACCOUNTS, startTestCoppice, type TestCoppice } from '../../helpers/test-coppice';
import { encryptedWorkbookBytes, workbookBytes } from './workbook-fixtures';

let coppice: TestCoppice;
let analyst: request.Agent;
let privacy: request.Agent;
let manager: request.Agent;

const demo = generateQuillfernExport({ rows: 300, seed: 11 });
const demoCsv = Buffer.from(quillfernCsv(demo), 'utf8');

beforeAll(async () => {
  // A small upload limit so that the 413 needs no large file.
  coppice = await startTestCoppice({ UPLOAD_MAX_MB: '0.5' });
  [analyst, privacy, manager] = await Promise.all([
    coppice.signIn(ACCOUNTS.analyst),
    coppice.signIn(ACCOUNTS.privacy),
    coppice.signIn(ACCOUNTS.managerNorth),
  ]);
});
afterAll(async () => {
  await coppice?.stop();
});

function upload(agent: request.Agent, bytes: Uint8Array | Buffer, fileName = 'export.csv') {
  return agent.post('/api/datasets').attach('file', Buffer.from(bytes), fileName);
}

async function datasetCount(): Promise<number> {
  const [{ count }] = await coppice.sql<{ count: string }>('SELECT count(*) FROM datasets');
  return Number(count);
}

/** Every row of every table of our database as text: what "anywhere in the database" means here. */
async function databaseDump(): Promise<string> {
  const tables = await coppice.sql<{ schema: string; name: string }>(
    `SELECT table_schema AS schema, table_name AS name FROM information_schema.tables
     WHERE table_type = 'BASE TABLE' AND table_schema NOT IN ('pg_catalog', 'information_schema')`,
  );
  const parts: string[] = [];
  for (const table of tables) {
    const rows = await coppice.sql<{ row: string }>(
      `SELECT row_to_json(t)::text AS row FROM "${table.schema}"."${table.name}" t`,
    );
    parts.push(...rows.map((r) => r.row));
  }
  return parts.join('\n');
}

describe('POST /api/datasets', () => {
  let datasetId: string;

  it('accepts the demo export as CSV and answers with the profile', async () => {
    const res = await upload(analyst, demoCsv, 'quillfern.csv');
    expect(res.status).toBe(201);
    datasetId = res.body.id;
    expect(res.body).toMatchObject({ status: 'profiled', rowCount: 300, name: 'quillfern', warnings: [] });
    const staffNo = res.body.columns.find((c: { name: string }) => c.name === 'Staff No');
    expect(staffNo).toMatchObject({ type: 'identifier', missingShare: 0, distinct: 300 });
    expect(res.body.droppedColumns).toEqual(['Full Name', 'Personal Email', 'Phone']);
    const sex = res.body.columns.find((c: { name: string }) => c.name === 'Sex');
    expect(sex.protectedCharacteristic.legalBasis).toMatch(/UK Equality Act 2010 s.4: sex/);
  });

  it('stores no raw employee ID, name, personal e-mail or phone number anywhere in the database', async () => {
    const dump = await databaseDump();
    const column = (name: string) => demo.header.indexOf(name as (typeof demo.header)[number]);
    for (const row of demo.rows.slice(0, 25)) {
      for (const name of ['Staff No', 'Full Name', 'Personal Email', 'Phone']) {
        expect(dump.includes(String(row[column(name)])), `${name} ${row[column(name)]}`).toBe(false);
      }
    }
    // The hashed IDs are there instead.
    expect(dump).toMatch(/"[0-9a-f]{64}"/);
  });

  it('records the upload in the audit trail, without employee-level data', async () => {
    const rows = await coppice.sql<{ action: string; details: { rows: number; dropped: string[] } }>(
      "SELECT action, details FROM audit_events WHERE object_id = $1 AND action = 'dataset.uploaded'",
      [datasetId],
    );
    expect(rows).toHaveLength(1);
    expect(rows[0].details).toMatchObject({ rows: 300, dropped: ['Full Name', 'Personal Email', 'Phone'] });
  });

  it('accepts the demo export as XLSX and lists the other sheet', async () => {
    const res = await upload(
      analyst,
      quillfernXlsx(generateQuillfernExport({ rows: 40, seed: 3 })),
      'q.xlsx',
    );
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ rowCount: 40, sheetName: 'Staff', sheetNames: ['Staff', 'Note'] });
  });

  const badInputs: [string, () => Uint8Array | Buffer, number, string][] = [
    ['an empty file', () => new Uint8Array(), 422, 'file_empty'],
    [
      'an image',
      () => new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]),
      415,
      'unsupported_file_type',
    ],
    ['a password-protected workbook', encryptedWorkbookBytes, 422, 'workbook_encrypted'],
    [
      'a workbook with merged cells',
      () =>
        workbookBytes([
          {
            name: 'S',
            rows: [
              ['Staff No', 'Crew'],
              ['QF-1', 'A'],
            ],
            merges: ['A2:B2'],
          },
        ]),
      422,
      'merged_cells',
    ],
    ['a header with no rows', () => Buffer.from('Staff No,Crew\n'), 422, 'no_rows'],
    ['a duplicated header', () => Buffer.from('Staff No,Crew,Crew\nQF-1,A,B\n'), 422, 'header_invalid'],
    ['an unbalanced quote', () => Buffer.from('Staff No,Crew\nQF-1,"A\n'), 422, 'csv_unbalanced_quotes'],
    ['a file over the size limit', () => Buffer.alloc(600 * 1024, 'a'), 413, 'file_too_large'],
  ];
  for (const [what, bytes, status, code] of badInputs) {
    it(`rejects ${what} with ${status} ${code} and stores nothing`, async () => {
      const before = await datasetCount();
      const res = await upload(analyst, bytes());
      expect(res.status).toBe(status);
      expect(res.body.error).toMatchObject({ code, message: expect.any(String) });
      expect(await datasetCount()).toBe(before);
    });
  }

  it('lists the rows that do not fit, with row numbers and reasons, and stores nothing', async () => {
    const before = await datasetCount();
    const lines = Array.from({ length: 30 }, (_, i) => `QF-${i},${i === 4 ? '2025-02-30' : '2024-02-01'}`);
    const res = await upload(analyst, Buffer.from(`Staff No,Start Date\n${lines.join('\n')}\n`));
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({
      code: 'rows_invalid',
      details: {
        rows: [{ row: 6, column: 'Start Date', reason: '"2025-02-30" is not a real date' }],
        count: 1,
      },
    });
    expect(await datasetCount()).toBe(before);
  });

  it('asks for a file when none is sent', async () => {
    const res = await analyst.post('/api/datasets').field('name', 'nothing');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('file_missing');
  });

  it('refuses managers with 403 on every dataset route', async () => {
    const id = datasetId;
    const answers = await Promise.all([
      upload(manager, demoCsv),
      manager.get('/api/datasets'),
      manager.get(`/api/datasets/${id}`),
      manager.put(`/api/datasets/${id}/mapping`).send(QUILLFERN_MAPPING),
      manager.delete(`/api/datasets/${id}`),
    ]);
    expect(answers.map((r) => r.status)).toEqual([403, 403, 403, 403, 403]);
    const privacyUpload = await upload(privacy, demoCsv);
    expect(privacyUpload.status).toBe(403);
  });

  describe('PUT /api/datasets/:id/mapping', () => {
    it('maps the demo export and previews headcount, leavers and the attrition rate', async () => {
      const res = await analyst.put(`/api/datasets/${datasetId}/mapping`).send(QUILLFERN_MAPPING);
      expect(res.status).toBe(200);
      expect(res.body.status).toBe('mapped');
      expect(res.body.mapping).toMatchObject({ employeeId: 'Staff No', team: 'Crew' });
      const { preview } = res.body;
      expect(preview.headcountStart).toBeGreaterThan(200);
      expect(preview.leaversVoluntary).toBeGreaterThan(0);
      // leavers ÷ average headcount × 100 (common practice; checks document, workforce figures)
      const average = (preview.headcountStart + preview.headcountEnd) / 2;
      expect(preview.attritionRate).toBeCloseTo(
        ((preview.leaversVoluntary + preview.leaversOther) / average) * 100,
        2,
      );
      const audit = await coppice.sql(
        "SELECT 1 FROM audit_events WHERE object_id = $1 AND action = 'dataset.mapped'",
        [datasetId],
      );
      expect(audit).toHaveLength(1);
    });

    it('lets the privacy officer read the dataset with its mapping', async () => {
      const list = await privacy.get('/api/datasets');
      expect(list.status).toBe(200);
      expect(list.body.find((d: { id: string }) => d.id === datasetId)).toMatchObject({
        status: 'mapped',
        rowCount: 300,
      });
      const detail = await privacy.get(`/api/datasets/${datasetId}`);
      expect(detail.body.preview.included).toBeGreaterThan(0);
    });

    it('gives the engine labels and features without identifiers or raw dates', async () => {
      const table = await loadDatasetColumns(datasetId);
      const names = table.features.map((f) => f.name);
      expect(names).toContain('Tenure (months)');
      expect(names).toContain('Age (years)');
      expect(names).toContain('Years Since Qualification');
      for (const gone of [
        'Staff No',
        'Full Name',
        'Start Date',
        'Leaving Date',
        'Leaving Reason',
        'Date of Birth',
        'Crew',
      ]) {
        expect(names).not.toContain(gone);
      }
      expect(table.labels).toHaveLength(table.rowCount);
      expect(table.features.every((f) => f.values.length === table.rowCount)).toBe(true);
      expect(table.features.find((f) => f.name === 'Age (years)')?.protectedCharacteristic).toBe('age');
      expect(table.teams).toHaveLength(table.rowCount);
    });

    it('rejects a body that does not fit the schema with 400', async () => {
      const res = await analyst.put(`/api/datasets/${datasetId}/mapping`).send({ employeeId: 'Staff No' });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_body');
    });

    it('names a column that was dropped at upload', async () => {
      const res = await analyst
        .put(`/api/datasets/${datasetId}/mapping`)
        .send({ ...QUILLFERN_MAPPING, team: 'Full Name' });
      expect(res.status).toBe(422);
      expect(res.body.error.details.problems[0]).toMatchObject({ field: 'team', column: 'Full Name' });
    });

    it('deletes the values of excluded columns', async () => {
      const res = await analyst
        .put(`/api/datasets/${datasetId}/mapping`)
        .send({ ...QUILLFERN_MAPPING, excluded: ['Marital Status'] });
      expect(res.status).toBe(200);
      expect(res.body.droppedColumns).toContain('Marital Status');
      const stored = await coppice.sql(
        "SELECT 1 FROM dataset_columns WHERE dataset_id = $1 AND name = 'Marital Status'",
        [datasetId],
      );
      expect(stored).toHaveLength(0);
    });

    it('rejects duplicate employee IDs, naming the rows, and keeps the dataset unmapped', async () => {
      const lines = [
        'Staff No,Crew,Line Manager Email,Start Date,Leaving Date,Leaving Reason',
        'QF-1,A,m@quillfern.example,2020-01-01,,',
        'QF-2,A,m@quillfern.example,2020-01-01,,',
        'QF-1,B,m@quillfern.example,2021-01-01,2026-01-01,Resignation',
      ];
      const created = await upload(analyst, Buffer.from(`${lines.join('\n')}\n`));
      expect(created.status).toBe(201);
      const res = await analyst
        .put(`/api/datasets/${created.body.id}/mapping`)
        .send(QUILLFERN_MAPPING_FOR_SMALL);
      expect(res.status).toBe(422);
      expect(res.body.error).toMatchObject({
        code: 'duplicate_employee_ids',
        details: { rows: [{ row: 4, column: 'Staff No', reason: 'same Staff No as row 2' }], count: 1 },
      });
      expect((await analyst.get(`/api/datasets/${created.body.id}`)).body.status).toBe('profiled');
    });
  });

  describe('DELETE /api/datasets/:id', () => {
    it('deletes the dataset and everything stored with it, and audits it', async () => {
      const res = await privacy.delete(`/api/datasets/${datasetId}`);
      expect(res.status).toBe(204);
      expect((await analyst.get(`/api/datasets/${datasetId}`)).status).toBe(404);
      const columns = await coppice.sql('SELECT 1 FROM dataset_columns WHERE dataset_id = $1', [datasetId]);
      expect(columns).toHaveLength(0);
      const audit = await coppice.sql(
        "SELECT 1 FROM audit_events WHERE object_id = $1 AND action = 'dataset.deleted'",
        [datasetId],
      );
      expect(audit).toHaveLength(1);
      expect((await analyst.delete(`/api/datasets/${datasetId}`)).status).toBe(404);
    });
  });
});

const QUILLFERN_MAPPING_FOR_SMALL = { ...QUILLFERN_MAPPING, department: undefined };

describe('the demo seed', () => {
  it('uploads and maps the invented demo export once', async () => {
    const first = await seedDemoDataset(coppice.config);
    expect(first).not.toBeNull();
    expect(await seedDemoDataset(coppice.config)).toBeNull();
    const detail = await analyst.get(`/api/datasets/${first}`);
    expect(detail.body).toMatchObject({ name: DEMO_DATASET_NAME, status: 'mapped', rowCount: 2400 });
  });
});
