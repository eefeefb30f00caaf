import { describe, expect, it } from 'vitest';
import { generateQuillfernExport } from '../../../backend/src/demo/quillfern';
import { quillfernCsv } from '../../../backend/src/demo/quillfern-csv';
import { hashEmployeeId } from '../../../backend/src/modules/datasets/employee-id-hash';
import { IntakeError } from '../../../backend/src/modules/datasets/parsing/intake-error';
import { readInline, runIntake } from '../../../backend/src/modules/datasets/run-intake';

const secret = 'k'.repeat(40);

describe('reading a large upload in a worker thread', () => {
  it('gives the same stored columns as reading it in place, with hashed IDs and identifiers dropped', async () => {
    const data = generateQuillfernExport({ rows: 60, seed: 2 });
    const bytes = new Uint8Array(Buffer.from(quillfernCsv(data), 'utf8'));
    const [inWorker, inPlace] = await Promise.all([
      runIntake({ bytes, secret }),
      readInline({ bytes, secret }),
    ]);
    expect(inWorker).toEqual(inPlace);
    const staffNo = inWorker.prepared.columns.find((c) => c.name === 'Staff No');
    expect(JSON.parse(staffNo?.valuesJson ?? '[]')[0]).toBe(hashEmployeeId(secret, String(data.rows[0][0])));
    expect(inWorker.prepared.dropped.map((d) => d.name)).toEqual(['Full Name', 'Personal Email', 'Phone']);
  });

  it('passes the typed error back from the worker', async () => {
    const error = await runIntake({ bytes: new Uint8Array(), secret }).catch((e) => e);
    expect(error).toBeInstanceOf(IntakeError);
    expect([error.status, error.code]).toEqual([422, 'file_empty']);
  });
});
