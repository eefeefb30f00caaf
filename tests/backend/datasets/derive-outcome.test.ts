import { describe, expect, it } from 'vitest';
import { deriveOutcome } from '../../../backend/src/modules/datasets/derive-outcome';
import { IntakeError } from '../../../backend/src/modules/datasets/parsing/intake-error';
import { parseUpload } from '../../../backend/src/modules/datasets/parsing/parse-upload';
import type { DatasetMapping } from '../../../shared/datasets';
import { datasetMappingSchema } from '../../../shared/datasets';
import { csvBytes } from './workbook-fixtures';

const HEADER = 'Staff No,Crew,Line Manager Email,Start Date,Leaving Date,Leaving Reason,Overtime';
// Window 2025-10-01 to 2026-09-30. Rows (spreadsheet row numbers 2–9):
const ROWS = [
  'QF-01,A,m.a@quillfern.example,2020-01-01,,,1', // 2 stayer: counted at start and end
  'QF-02,A,m.a@quillfern.example,2021-06-15,2026-03-31,Resignation,2', // 3 voluntary leaver
  'QF-03,A,m.a@quillfern.example,2019-03-01,2026-05-15,Dismissal,3', // 4 other leaver
  'QF-04,B,m.b@quillfern.example,2026-01-10,,,4', // 5 starter in the window: counted at end only
  'QF-05,B,m.b@quillfern.example,2026-11-02,,,5', // 6 started after the window ended
  'QF-06,B,m.b@quillfern.example,2018-01-01,2025-06-30,Resignation,6', // 7 left before the window began
  'QF-07,B,m.b@quillfern.example,,,,7', // 8 no start date
  'QF-08,B,m.b@quillfern.example,2022-02-01,2026-12-01,Resignation,8', // 9 leaves after the window: a stayer
];

const MAPPING: DatasetMapping = {
  employeeId: 'Staff No',
  team: 'Crew',
  managerEmail: 'Line Manager Email',
  outcome: {
    kind: 'exit-dates',
    startDate: 'Start Date',
    exitDate: 'Leaving Date',
    exitReason: 'Leaving Reason',
    voluntaryReasons: ['Resignation'],
    windowStart: '2025-10-01',
    windowEnd: '2026-09-30',
  },
  excluded: [],
};

async function table(rows = ROWS, header = HEADER) {
  return (await parseUpload(csvBytes(`${header}\n${rows.join('\n')}\n`))).table;
}

function mappingProblems(error: unknown) {
  expect(error).toBeInstanceOf(IntakeError);
  expect((error as IntakeError).status).toBe(422);
  return (error as IntakeError).details as {
    problems: { field: string; column?: string; problem: string }[];
  };
}

describe('deriving the outcome from exit dates', () => {
  it('labels voluntary exits in the window 1, everyone else 0, and excludes rows outside it with reasons', async () => {
    const result = deriveOutcome(await table(), MAPPING);
    expect(result.labels).toEqual([0, 1, 0, 0, null, null, null, 0]);
    expect(result.preview.excluded).toEqual({
      count: 3,
      reasons: [
        { reason: 'started after the window ended', count: 1 },
        { reason: 'left before the window began', count: 1 },
        { reason: 'no Start Date', count: 1 },
      ],
      rows: [
        { row: 6, reason: 'started after the window ended' },
        { row: 7, reason: 'left before the window began' },
        { row: 8, reason: 'no Start Date' },
      ],
    });
  });

  it('previews headcount, leavers and the attrition rate (leavers ÷ average headcount × 100)', async () => {
    const { preview } = deriveOutcome(await table(), MAPPING);
    // Common practice (checks document, workforce figures): start 4 (rows 2, 3, 4, 9), end 3 (rows 2, 5, 9),
    // leavers 2 → 2 ÷ 3.5 × 100 = 57.14; voluntary 1 ÷ 3.5 × 100 = 28.57.
    expect(preview).toMatchObject({
      kind: 'exit-dates',
      included: 5,
      headcountStart: 4,
      headcountEnd: 3,
      leaversVoluntary: 1,
      leaversOther: 1,
      attritionRate: 57.14,
      voluntaryAttritionRate: 28.57,
    });
  });

  it('derives tenure in months at exit for leavers and at the window end for stayers', async () => {
    const { tenureMonths } = deriveOutcome(await table(), MAPPING);
    // 2020-01-01 → 2026-09-30 is 2464 days = 80.95 months of 30.436875 days; 2021-06-15 → 2026-03-31 is 1750 days.
    expect(tenureMonths?.[0]).toBe(81);
    expect(tenureMonths?.[1]).toBe(57.5);
    expect(tenureMonths?.[4]).toBeNull();
  });

  it('rejects duplicate employee IDs, naming the rows', async () => {
    const rows = [
      ...ROWS,
      'QF-02,A,m.a@quillfern.example,2021-06-15,,,2',
      'QF-05,A,m.a@quillfern.example,2021-06-15,,,2',
    ];
    const error = await Promise.resolve(table(rows)).then((t) => {
      try {
        deriveOutcome(t, MAPPING);
      } catch (e) {
        return e as IntakeError;
      }
    });
    expect([error?.status, error?.code]).toEqual([422, 'duplicate_employee_ids']);
    expect(error?.details).toEqual({
      rows: [
        { row: 10, column: 'Staff No', reason: 'same Staff No as row 3' },
        { row: 11, column: 'Staff No', reason: 'same Staff No as row 6' },
      ],
      count: 2,
    });
    expect(error?.message).toMatch(/rows 10, 11/);
  });

  it('names each column that does not suit its role', async () => {
    const bad: DatasetMapping = {
      ...MAPPING,
      employeeId: 'Overtime',
      team: 'Squad',
      outcome: {
        ...(MAPPING.outcome as Extract<DatasetMapping['outcome'], { kind: 'exit-dates' }>),
        startDate: 'Crew',
        voluntaryReasons: ['Resigned'],
      },
      excluded: ['Crew'],
    };
    let caught: unknown;
    try {
      deriveOutcome(await table(), bad);
    } catch (error) {
      caught = error;
    }
    expect(mappingProblems(caught).problems).toEqual([
      {
        field: 'employeeId',
        column: 'Overtime',
        problem: expect.stringMatching(/number column, not an identifier/),
      },
      { field: 'team', column: 'Squad', problem: 'there is no column with this name in the dataset' },
      { field: 'outcome.startDate', column: 'Crew', problem: 'is a category column, not dates' },
      { field: 'outcome.voluntaryReasons', column: 'Leaving Reason', problem: 'has no value "Resigned"' },
      { field: 'excluded', column: 'Crew', problem: 'is mapped above and cannot be excluded' },
    ]);
  });

  it('asks for the date order when the dates are ambiguous, and uses it when given', async () => {
    const header = 'Staff No,Crew,Line Manager Email,Start Date,Leaving Date,Leaving Reason';
    const rows = [
      'QF-1,A,m@quillfern.example,01/02/2020,,',
      'QF-2,A,m@quillfern.example,03/04/2021,05/06/2026,Resignation',
    ];
    const t = await table(rows, header);
    let caught: unknown;
    try {
      deriveOutcome(t, MAPPING);
    } catch (error) {
      caught = error;
    }
    expect(mappingProblems(caught).problems[0]).toMatchObject({ field: 'dateOrder', column: 'Start Date' });
    // 01/02/2020 to the window end 2026-09-30: day-first 2433 days, month-first 2463 days.
    expect(deriveOutcome(t, { ...MAPPING, dateOrder: 'dmy' }).tenureMonths?.[0]).toBe(79.9);
    expect(deriveOutcome(t, { ...MAPPING, dateOrder: 'mdy' }).tenureMonths?.[0]).toBe(80.9);
  });
});

describe('deriving the outcome from a yes/no column', () => {
  it('labels the positive values 1 and excludes rows without a value', async () => {
    const t = await table(
      ['QF-1,A,m@quillfern.example,Yes', 'QF-2,A,m@quillfern.example,No', 'QF-3,A,m@quillfern.example,'],
      'Staff No,Crew,Line Manager Email,Left',
    );
    const result = deriveOutcome(t, {
      ...MAPPING,
      outcome: { kind: 'flag', column: 'Left', positiveValues: ['Yes'] },
    });
    expect(result.labels).toEqual([1, 0, null]);
    expect(result.preview).toMatchObject({ included: 2, leaversVoluntary: 1, attritionRate: 50 });
  });
});

describe('the mapping body', () => {
  it('accepts the body of the API contract and rejects a window that ends before it starts', () => {
    expect(datasetMappingSchema.safeParse(MAPPING).success).toBe(true);
    const backwards = { ...MAPPING, outcome: { ...MAPPING.outcome, windowEnd: '2025-01-01' } };
    const result = datasetMappingSchema.safeParse(backwards);
    expect(result.success).toBe(false);
    expect(result.error?.issues[0].path).toEqual(['outcome', 'windowEnd']);
  });
});
