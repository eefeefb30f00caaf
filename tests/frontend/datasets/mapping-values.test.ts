import { describe, expect, it } from 'vitest';
import {
  completeMapping,
  initialValues,
  type MappingFormValues,
  mappingResolver,
  toMapping,
} from '../../../frontend/src/features/datasets/components/mapping-values';
import type { DatasetDetail } from '../../../shared/datasets';

const dataset: DatasetDetail = {
  id: 'd1',
  name: 'export',
  status: 'profiled',
  rowCount: 3,
  uploadedBy: 'analyst@quillfern.example',
  uploadedAt: '2026-10-02T09:00:00Z',
  columns: [
    { name: 'Staff No', type: 'identifier', missingShare: 0, distinct: 3 },
    { name: 'Full Name', type: 'free-text', missingShare: 0, distinct: 3 },
    { name: 'Crew', type: 'category', missingShare: 0, distinct: 2 },
    { name: 'Depot', type: 'category', missingShare: 0, distinct: 1 },
    { name: 'Line Manager Email', type: 'category', missingShare: 0, distinct: 1 },
    { name: 'Start Date', type: 'date', missingShare: 0, distinct: 3, min: '2020-01-01', max: '2024-01-01' },
    {
      name: 'Leaving Date',
      type: 'date',
      missingShare: 0.6,
      distinct: 1,
      min: '2026-09-12',
      max: '2026-09-12',
    },
    {
      name: 'Leaving Reason',
      type: 'category',
      missingShare: 0.6,
      distinct: 2,
      topCategories: [
        { value: 'Resignation', count: 1 },
        { value: 'Dismissal', count: 1 },
      ],
    },
  ],
  droppedColumns: ['Full Name'],
  warnings: [],
  sheetName: null,
  sheetNames: [],
  mapping: null,
  preview: null,
};

describe('the mapping form', () => {
  it('guesses the columns from their names and the window from the last leaving date', () => {
    const values = initialValues(dataset);
    expect(values).toMatchObject({
      employeeId: 'Staff No',
      team: 'Crew',
      department: 'Depot',
      managerEmail: 'Line Manager Email',
      outcomeKind: 'exit-dates',
      startDate: 'Start Date',
      exitDate: 'Leaving Date',
      exitReason: 'Leaving Reason',
      voluntaryReasons: ['Resignation'],
      windowStart: '2025-10-01',
      windowEnd: '2026-09-30',
    });
    expect(completeMapping(values)).not.toBeNull();
  });

  it('sends a single ticked reason as a list, and leaves empty optional columns out', () => {
    const values = { ...initialValues(dataset), voluntaryReasons: 'Resignation', department: '' };
    const body = toMapping(values as unknown as MappingFormValues);
    expect(body.outcome).toMatchObject({ voluntaryReasons: ['Resignation'] });
    expect(body.department).toBeUndefined();
  });

  it("shows the shared schema's messages beside the form's own fields", async () => {
    const values = { ...initialValues(dataset), voluntaryReasons: [], windowEnd: '2025-01-01', team: '' };
    const result = await mappingResolver(values, undefined, { fields: {}, shouldUseNativeValidation: false });
    expect(Object.keys(result.errors).sort()).toEqual(['team', 'voluntaryReasons', 'windowEnd']);
    expect(result.errors.windowEnd?.message).toBe('The window must end after it starts');
  });
});
