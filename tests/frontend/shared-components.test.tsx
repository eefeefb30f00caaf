import { zodResolver } from '@hookform/resolvers/zod';
import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { FormProvider, useForm } from 'react-hook-form';
import { afterEach, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { DataTable, type DataTableColumn } from '../../frontend/src/components/data-table';
import { ErrorNotice } from '../../frontend/src/components/error-notice';
import { CheckboxGroup, NumberField } from '../../frontend/src/components/form-fields';
import { formatPercent, StatFigure } from '../../frontend/src/components/stat-figure';
import { WITHHELD_TEXT } from '../../frontend/src/components/withheld';
import { ApiError } from '../../frontend/src/lib/api-client';

afterEach(cleanup);

describe('StatFigure', () => {
  it('shows a figure with its label', () => {
    render(<StatFigure label="Attrition rate" value={0.142} format={(v) => formatPercent(v)} />);
    expect(screen.getByText('Attrition rate')).toBeTruthy();
    expect(screen.getByText('14.2%')).toBeTruthy();
  });

  it('draws a withheld figure hatched, with the words and no number', () => {
    const { container } = render(<StatFigure label="Leavers" value={{ withheld: true }} />);
    expect(screen.getByText(WITHHELD_TEXT)).toBeTruthy();
    expect(container.querySelector('.hatch-withheld')).not.toBeNull();
    expect(container.textContent).not.toMatch(/\d/);
  });
});

describe('ErrorNotice', () => {
  it('lists the row errors an upload was refused for', () => {
    const error = new ApiError(422, 'unusable_rows', 'Two rows cannot be read', [
      { row: 14, message: 'Start Date is not a date' },
      { row: 90, reason: 'Staff No is empty' },
    ]);
    render(<ErrorNotice error={error} title="The dataset was not uploaded" />);
    const alert = screen.getByRole('alert');
    expect(within(alert).getByText('Two rows cannot be read')).toBeTruthy();
    expect(within(alert).getByText('Row 14: Start Date is not a date')).toBeTruthy();
    expect(within(alert).getByText('Row 90: Staff No is empty')).toBeTruthy();
  });
});

type Segment = { rule: string; employees: number; share: number | null };
const segments: Segment[] = [
  { rule: 'Region is North', employees: 40, share: 0.2 },
  { rule: 'Overtime above 10.5', employees: 120, share: null },
  { rule: 'Tenure at most 2', employees: 75, share: 0.31 },
];
const columns: DataTableColumn<Segment>[] = [
  { key: 'rule', header: 'Segment', cell: (s) => s.rule },
  {
    key: 'employees',
    header: 'Employees',
    cell: (s) => s.employees,
    sortValue: (s) => s.employees,
    align: 'right',
  },
  { key: 'share', header: 'Leaver share', cell: (s) => s.share ?? '–', sortValue: (s) => s.share },
];

describe('DataTable', () => {
  function firstColumn(): string[] {
    return screen
      .getAllByRole('row')
      .slice(1)
      .map((row) => within(row).getAllByRole('cell')[0].textContent ?? '');
  }

  it('sorts by a column when its header is pressed, and back again', () => {
    render(<DataTable caption="Segments" columns={columns} rows={segments} rowKey={(s) => s.rule} />);
    fireEvent.click(screen.getByRole('button', { name: /Employees/ }));
    expect(firstColumn()).toEqual(['Region is North', 'Tenure at most 2', 'Overtime above 10.5']);
    expect(screen.getByRole('columnheader', { name: /Employees/ }).getAttribute('aria-sort')).toBe(
      'ascending',
    );
    fireEvent.click(screen.getByRole('button', { name: /Employees/ }));
    expect(firstColumn()).toEqual(['Overtime above 10.5', 'Tenure at most 2', 'Region is North']);
  });

  it('keeps rows without a value last in either direction', () => {
    render(
      <DataTable
        caption="Segments"
        columns={columns}
        rows={segments}
        rowKey={(s) => s.rule}
        initialSort={{ key: 'share', direction: 'descending' }}
      />,
    );
    expect(firstColumn()).toEqual(['Tenure at most 2', 'Region is North', 'Overtime above 10.5']);
  });
});

const runSchema = z.object({
  maxDepth: z.number({ error: 'Enter a whole number' }).int().min(1, 'At least 1'),
  features: z.array(z.string()).min(1, 'Choose at least one feature'),
});
type RunForm = z.infer<typeof runSchema>;

function RunFormDemo() {
  const form = useForm<RunForm>({
    resolver: zodResolver(runSchema),
    defaultValues: { maxDepth: 0, features: [] },
  });
  return (
    <FormProvider {...form}>
      <form onSubmit={form.handleSubmit(() => {})}>
        <NumberField<RunForm> name="maxDepth" label="Max depth" />
        <CheckboxGroup<RunForm>
          name="features"
          label="Features"
          options={[
            { value: 'Overtime', label: 'Overtime' },
            {
              value: 'Date of Birth',
              label: 'Date of Birth',
              disabled: true,
              note: 'blocked by the privacy policy',
            },
          ]}
        />
        <button type="submit">Train</button>
      </form>
    </FormProvider>
  );
}

describe('form fields', () => {
  it('show the zod message beside the field it is about', async () => {
    render(<RunFormDemo />);
    await act(async () => {
      fireEvent.click(screen.getByRole('button', { name: 'Train' }));
    });
    const depth = screen.getByLabelText('Max depth');
    expect(depth.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByText('At least 1')).toBeTruthy();
    expect(screen.getByText('Choose at least one feature')).toBeTruthy();
    expect((screen.getByLabelText(/Date of Birth/) as HTMLInputElement).disabled).toBe(true);
  });
});
