import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { hashEmployeeId } from '../../../backend/src/modules/datasets/employee-id-hash';
import { parseUpload } from '../../../backend/src/modules/datasets/parsing/parse-upload';
import { profileColumn } from '../../../backend/src/modules/datasets/parsing/profile';
import type { TypedColumn } from '../../../backend/src/modules/datasets/parsing/type-columns';
import { csvBytes } from './workbook-fixtures';

function staffCsv(rows: number): string {
  const header =
    'Staff No,Full Name,Personal Email,Phone,NI Number,Line Manager Email,Date of Birth,Sex,Ethnicity,Marital Status,Religion,Disability,Crew,Engagement Score,Bank Staff,Notes';
  const sexes = ['Female', 'Male'];
  const ethnicities = ['White British', 'Asian', 'Black British', 'Mixed'];
  const marital = ['Single', 'Married', 'Divorced'];
  const lines = Array.from({ length: rows }, (_, i) =>
    [
      `QF-${String(i).padStart(4, '0')}`,
      `Ada Example${String.fromCharCode(65 + (i % 26))}`,
      `person${i}@mail.example`,
      `07700 900${String(i).padStart(3, '0')}`,
      `QQ ${String(10 + (i % 80)).padStart(2, '0')} 34 56 C`,
      i % 2 ? 'manager.north@quillfern.example' : 'manager.south@quillfern.example',
      `19${60 + (i % 30)}-0${1 + (i % 9)}-1${i % 9}`,
      sexes[i % 2],
      ethnicities[i % 4],
      marital[i % 3],
      i % 5 === 0 ? 'No religion' : 'Christian',
      i % 7 === 0 ? 'Yes' : 'No',
      `Crew ${i % 3}`,
      i % 10 === 0 ? '' : String(1 + (i % 5)),
      i % 2 ? 'Y' : 'N',
      `"Visited clients in the east of the county on shift pattern ${i}, with a long note attached"`,
    ].join(','),
  );
  return `${header}\n${lines.join('\n')}\n`;
}

describe('the profile of an upload', () => {
  it('gives each column a type, missing share, distinct count and statistics', async () => {
    const { profile } = await parseUpload(csvBytes(staffCsv(40)));
    const byName = Object.fromEntries(profile.map((c) => [c.name, c]));
    expect(byName['Staff No']).toMatchObject({ type: 'identifier', distinct: 40, missingShare: 0 });
    expect(byName['Crew']).toMatchObject({ type: 'category', distinct: 3 });
    expect(byName['Crew'].topCategories).toEqual([
      { value: 'Crew 0', count: 14 },
      { value: 'Crew 1', count: 13 },
      { value: 'Crew 2', count: 13 },
    ]);
    // 4 of the 40 rows have no score; the others are 2,3,4,5 and 1 repeated.
    expect(byName['Engagement Score']).toMatchObject({ type: 'number', missingShare: 0.1, min: 1, max: 5 });
    expect(byName['Engagement Score'].median).toBe(3);
    expect(byName['Bank Staff'].type).toBe('yes-no');
    expect(byName['Date of Birth']).toMatchObject({ type: 'date', min: '1960-01-10' });
    expect(byName['Notes'].type).toBe('free-text');
  });

  it('flags names, personal e-mails, phones and national IDs as direct identifiers, but not the manager e-mail', async () => {
    const { profile } = await parseUpload(csvBytes(staffCsv(40)));
    const direct = Object.fromEntries(profile.map((c) => [c.name, c.directIdentifier?.kind ?? null]));
    expect(direct).toMatchObject({
      'Staff No': null,
      'Full Name': 'name',
      'Personal Email': 'email',
      Phone: 'phone',
      'NI Number': 'national-id',
      'Line Manager Email': null,
      Crew: null,
    });
  });

  it('suggests protected characteristics with their legal basis', async () => {
    const { profile } = await parseUpload(csvBytes(staffCsv(40)));
    const flagged = Object.fromEntries(
      profile
        .filter((c) => c.protectedCharacteristic)
        .map((c) => [c.name, c.protectedCharacteristic?.legalBasis]),
    );
    // UK Equality Act 2010 s.4 and GDPR Art. 9(1), as listed in the checks document.
    expect(flagged).toEqual({
      'Date of Birth': expect.stringContaining('UK Equality Act 2010 s.4: age'),
      Sex: expect.stringContaining('UK Equality Act 2010 s.4: sex'),
      Ethnicity: expect.stringContaining('GDPR Art. 9(1): racial or ethnic origin'),
      'Marital Status': 'UK Equality Act 2010 s.4: marriage and civil partnership',
      Religion: expect.stringContaining('religion or belief'),
      Disability: expect.stringContaining('UK Equality Act 2010 s.4: disability'),
    });
  });

  it('recognises a protected characteristic by its values under an unhelpful header', async () => {
    const rows = Array.from({ length: 20 }, (_, i) => `QF-${i},${i % 2 ? 'Female' : 'Male'}`).join('\n');
    const { profile } = await parseUpload(csvBytes(`Staff No,Field 7\n${rows}\n`));
    expect(profile[1].protectedCharacteristic?.characteristic).toBe('sex');
  });
});

describe('hashing employee IDs', () => {
  it('is HMAC-SHA256 in hex, keyed by the server secret', () => {
    // RFC 4231 test case 2: key "Jefe", data "what do ya want for nothing?".
    expect(hashEmployeeId('Jefe', 'what do ya want for nothing?')).toBe(
      '5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843',
    );
    expect(hashEmployeeId('secret-a', 'QF-0001')).not.toBe(hashEmployeeId('secret-b', 'QF-0001'));
  });
});

describe('the range and median an analyst sees in the profile', () => {
  // Common practice: the median of an even count of numbers is the mean of the two middle values.
  it('match sorting every value, for any column of numbers or dates with repeats and gaps', () => {
    fc.assert(
      fc.property(
        fc.array(fc.option(fc.integer({ min: -20, max: 20 }), { nil: null }), {
          minLength: 1,
          maxLength: 60,
        }),
        fc.boolean(),
        (cells, asDates) => {
          const column: TypedColumn = asDates
            ? {
                name: 'Start Date',
                type: 'date',
                dateOrder: 'not-needed',
                values: cells.map((n) =>
                  n === null ? null : `2025-${String((Math.abs(n) % 12) + 1).padStart(2, '0')}-01`,
                ),
              }
            : {
                name: 'Overtime Hours',
                type: 'number',
                values: cells.map((n) => (n === null ? null : n / 2)),
              };
          const present = (column.values as (number | string | null)[]).filter((v) => v !== null);
          const sorted = asDates
            ? [...present].sort()
            : [...present].sort((a, b) => (a as number) - (b as number));
          const profile = profileColumn(column, cells.length);
          if (sorted.length === 0) {
            expect(profile.median).toBeUndefined();
            return;
          }
          const middle = Math.floor((sorted.length - 1) / 2);
          const median =
            !asDates && sorted.length % 2 === 0
              ? ((sorted[middle] as number) + (sorted[middle + 1] as number)) / 2
              : sorted[middle];
          expect([profile.min, profile.median, profile.max]).toEqual([sorted[0], median, sorted.at(-1)]);
        },
      ),
    );
  });
});
