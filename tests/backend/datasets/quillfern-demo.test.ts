import { describe, expect, it } from 'vitest';
import {
  DEMO_MANAGER_NORTH,
  DEMO_MANAGER_SOUTH,
  generateQuillfernExport,
  QUILLFERN_MAPPING,
} from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import { quillfernXlsx } from '../../../backend/src/demo/quillfern-xlsx';
import { deriveOutcome } from '../../../backend/src/modules/datasets/derive-outcome';
import { parseUpload } from '../../../backend/src/modules/datasets/parsing/parse-upload';

// Small exports keep the suite fast; the generator's shape does not depend on the row count.
const data = generateQuillfernExport({ rows: 400, seed: 7 });

describe('the invented Quillfern Community Care export', () => {
  it('is the same for the same seed and different for another', () => {
    expect(generateQuillfernExport({ rows: 400, seed: 7 }).rows).toEqual(data.rows);
    expect(generateQuillfernExport({ rows: 400, seed: 8 }).rows).not.toEqual(data.rows);
  });

  it('gives the demo managers teams, one of them smaller than 5 people', () => {
    const crew = data.header.indexOf('Crew');
    const manager = data.header.indexOf('Line Manager Email');
    const sizes = new Map<string, number>();
    for (const row of data.rows) {
      if (row[manager] === DEMO_MANAGER_NORTH || row[manager] === DEMO_MANAGER_SOUTH) {
        const key = `${row[manager]}|${row[crew]}`;
        sizes.set(key, (sizes.get(key) ?? 0) + 1);
      }
    }
    const north = [...sizes].filter(([key]) => key.startsWith(DEMO_MANAGER_NORTH)).map(([, n]) => n);
    const south = [...sizes].filter(([key]) => key.startsWith(DEMO_MANAGER_SOUTH)).map(([, n]) => n);
    expect(north.length).toBeGreaterThanOrEqual(2);
    expect(Math.min(...north)).toBeLessThan(5);
    expect(south.length).toBeGreaterThanOrEqual(1);
  });

  it('goes through the parser and the outcome as CSV: identifiers and personal fields flagged, outcome derived', async () => {
    const parsed = await parseUpload(new Uint8Array(Buffer.from(quillfernCsv(data), 'utf8')));
    expect(parsed.table.rowNumbers).toHaveLength(400);
    const flags = Object.fromEntries(
      parsed.profile.map((c) => [
        c.name,
        c.directIdentifier?.kind ?? c.protectedCharacteristic?.characteristic ?? null,
      ]),
    );
    expect(flags).toMatchObject({
      'Staff No': null,
      'Full Name': 'name',
      'Personal Email': 'email',
      Phone: 'phone',
      'Date of Birth': 'age',
      Sex: 'sex',
      Ethnicity: 'race or ethnic origin',
      Disability: 'disability or health',
      'Marital Status': 'marriage or civil partnership',
      'Line Manager Email': null,
      'Years Since Qualification': null,
    });
    const { preview, labels } = deriveOutcome(parsed.table, QUILLFERN_MAPPING);
    expect(preview.headcountStart).toBeGreaterThan(300);
    expect(preview.leaversVoluntary).toBeGreaterThan(20);
    expect(preview.leaversOther).toBeGreaterThan(0);
    expect(preview.attritionRate).toBeGreaterThan(8);
    expect(preview.attritionRate).toBeLessThan(40);
    expect(labels.filter((l) => l === 1)).toHaveLength(preview.leaversVoluntary);
  });

  it('reads back the same from XLSX (dates as date cells) as from CSV', async () => {
    const [fromCsv, fromXlsx] = await Promise.all([
      parseUpload(new Uint8Array(Buffer.from(quillfernCsv(data), 'utf8'))),
      parseUpload(quillfernXlsx(data)),
    ]);
    expect(fromXlsx.sheetNames).toEqual(['Staff', 'Note']);
    expect(fromXlsx.profile.map((c) => [c.name, c.type])).toEqual(
      fromCsv.profile.map((c) => [c.name, c.type]),
    );
    for (const name of ['Start Date', 'Leaving Date', 'Engagement Score', 'Crew']) {
      const a = fromCsv.table.columns.find((c) => c.name === name)?.values;
      const b = fromXlsx.table.columns.find((c) => c.name === name)?.values;
      expect(b).toEqual(a);
    }
    expect(deriveOutcome(fromXlsx.table, QUILLFERN_MAPPING).preview).toEqual(
      deriveOutcome(fromCsv.table, QUILLFERN_MAPPING).preview,
    );
  });

  it('plants the proxy: years since qualification moves with age', async () => {
    const parsed = await parseUpload(new Uint8Array(Buffer.from(quillfernCsv(data), 'utf8')));
    const birth = parsed.table.columns.find((c) => c.name === 'Date of Birth')?.values as string[];
    const years = parsed.table.columns.find((c) => c.name === 'Years Since Qualification')?.values as (
      | number
      | null
    )[];
    const pairs = years.flatMap((y, i) => (y === null ? [] : [[2025 - Number(birth[i].slice(0, 4)), y]]));
    const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
    const ax = mean(pairs.map((p) => p[0]));
    const ay = mean(pairs.map((p) => p[1]));
    const cov = mean(pairs.map(([x, y]) => (x - ax) * (y - ay)));
    const sd = (i: 0 | 1, m: number) => Math.sqrt(mean(pairs.map((p) => (p[i] - m) ** 2)));
    expect(cov / (sd(0, ax) * sd(1, ay))).toBeGreaterThan(0.9);
  });
});
