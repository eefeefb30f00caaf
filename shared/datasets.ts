import { z } from 'zod';

/** Column types the profile infers. */
export const columnTypeSchema = z.enum(['number', 'category', 'date', 'yes-no', 'identifier', 'free-text']);
export type ColumnType = z.infer<typeof columnTypeSchema>;

const columnName = z
  .string()
  .trim()
  .min(1, 'Choose a column')
  .max(200, 'Column names are at most 200 characters');
const isoDate = z.iso.date('Use a date in the form YYYY-MM-DD');

export const exitDatesOutcomeSchema = z.strictObject({
  kind: z.literal('exit-dates'),
  startDate: columnName,
  exitDate: columnName,
  exitReason: columnName,
  voluntaryReasons: z.array(z.string().min(1)).min(1, 'Tick at least one reason that counts as voluntary'),
  windowStart: isoDate,
  windowEnd: isoDate,
});

export const flagOutcomeSchema = z.strictObject({
  kind: z.literal('flag'),
  column: columnName,
  positiveValues: z.array(z.string().min(1)).min(1, 'Choose at least one value that means the person left'),
});

export const outcomeSchema = z.discriminatedUnion('kind', [exitDatesOutcomeSchema, flagOutcomeSchema]);
export type OutcomeDefinition = z.infer<typeof outcomeSchema>;

/** Body of `PUT /api/datasets/:id/mapping`; column names exactly as in the file's header row. */
export const datasetMappingSchema = z
  // Unknown keys (and keys like __proto__) are refused, not silently dropped.
  .strictObject({
    employeeId: columnName,
    team: columnName,
    department: columnName.optional(),
    managerEmail: columnName.optional(),
    managerId: columnName.optional(),
    outcome: outcomeSchema,
    excluded: z.array(z.string().max(200)).max(1000).default([]),
    /** how to read dates like 03/04/2025 where the file itself cannot tell */
    dateOrder: z.enum(['dmy', 'mdy']).optional(),
  })
  .superRefine((mapping, ctx) => {
    if (!mapping.managerEmail && !mapping.managerId) {
      ctx.addIssue({
        code: 'custom',
        path: ['managerEmail'],
        message: 'Choose the manager e-mail column (or a manager ID column)',
      });
    }
    const { outcome } = mapping;
    if (outcome.kind === 'exit-dates' && outcome.windowStart >= outcome.windowEnd) {
      ctx.addIssue({
        code: 'custom',
        path: ['outcome', 'windowEnd'],
        message: 'The window must end after it starts',
      });
    }
  });
export type DatasetMapping = z.infer<typeof datasetMappingSchema>;
export type DatasetMappingInput = z.input<typeof datasetMappingSchema>;

export type DirectIdentifierKind = 'name' | 'email' | 'phone' | 'national-id';

export type ColumnProfile = {
  name: string;
  type: ColumnType;
  /** share of rows without a value, 0–1 */
  missingShare: number;
  distinct: number;
  /** numbers: numbers; dates: ISO dates */
  min?: number | string;
  median?: number | string;
  max?: number | string;
  /** most frequent values of a category or yes/no column (up to 50), most frequent first */
  topCategories?: { value: string; count: number }[];
  /** dates only: how day and month are ordered; 'ambiguous' needs `dateOrder` in the mapping */
  dateOrder?: 'dmy' | 'mdy' | 'ambiguous' | 'not-needed';
  /** how the column is kept: its values, keyed hashes of them, or not at all */
  storage?: 'values' | 'keyed-hash' | 'not-stored';
  /** dropped before storage */
  directIdentifier?: { kind: DirectIdentifierKind; reason: string };
  /** suggested to the privacy officer as a blocked field */
  protectedCharacteristic?: { characteristic: string; legalBasis: string };
};

export type OutcomePreview = {
  kind: OutcomeDefinition['kind'];
  /** rows with an outcome (not excluded) */
  included: number;
  /** exit-dates only */
  headcountStart: number | null;
  headcountEnd: number | null;
  leaversVoluntary: number;
  leaversOther: number;
  /** all leavers ÷ average headcount × 100 (exit-dates), or positives ÷ included × 100 (flag) */
  attritionRate: number | null;
  /** voluntary leavers ÷ average headcount × 100 */
  voluntaryAttritionRate: number | null;
  excluded: {
    count: number;
    reasons: { reason: string; count: number }[];
    rows: { row: number; reason: string }[];
  };
};

export type DatasetStatus = 'profiled' | 'mapped';

export type DatasetSummary = {
  id: string;
  name: string;
  status: DatasetStatus;
  rowCount: number;
  uploadedBy: string;
  uploadedAt: string;
};

export type DatasetDetail = DatasetSummary & {
  columns: ColumnProfile[];
  /** direct identifiers dropped before storage */
  droppedColumns: string[];
  warnings: string[];
  sheetName: string | null;
  sheetNames: string[];
  mapping: DatasetMapping | null;
  preview: OutcomePreview | null;
};

/** 201 body of `POST /api/datasets`. */
export type DatasetUploadResponse = DatasetDetail;
