import { useEffect, useMemo, useState } from 'react';
import { FormProvider, useForm, useWatch } from 'react-hook-form';
import type { DatasetDetail, DatasetMapping } from '../../../../../shared/datasets';
import { Button } from '../../../components/button';
import { CheckboxGroup, type FieldOption, SelectField, TextField } from '../../../components/form-fields';
import { ProgressBar } from '../../../components/progress-bar';
import { useMappingPreview } from '../api/preview-mapping';
import { useSaveMapping } from '../api/save-mapping';
import { IntakeProblems } from './intake-problems';
import { completeMapping, initialValues, type MappingFormValues, mappingResolver } from './mapping-values';
import { OutcomePreviewPanel } from './outcome-preview';

function useDebounced<T>(value: T, ms: number): T {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return debounced;
}

const option = (name: string): FieldOption => ({ value: name, label: name });

export type MappingFormProps = {
  dataset: DatasetDetail;
  /** analysts may change the mapping; privacy officers read it */
  canEdit: boolean;
};

/** Which columns play which part, how leaving is defined, and the outcome counts that gives, live. */
export function MappingForm({ dataset, canEdit }: MappingFormProps) {
  const form = useForm<MappingFormValues>({
    resolver: mappingResolver,
    defaultValues: initialValues(dataset),
  });
  const save = useSaveMapping(dataset.id);
  const values = useWatch({ control: form.control }) as MappingFormValues;

  const stored = useMemo(
    () => dataset.columns.filter((c) => !dataset.droppedColumns.includes(c.name)),
    [dataset.columns, dataset.droppedColumns],
  );
  const of = (...types: string[]) => stored.filter((c) => types.includes(c.type)).map((c) => option(c.name));
  const valuesOf = (name: string) =>
    (stored.find((c) => c.name === name)?.topCategories ?? []).map((c) => ({
      value: c.value,
      label: c.value,
      note: `${c.count.toLocaleString('en-GB')} row(s)`,
    }));
  const ambiguousDates = stored.some((c) => c.type === 'date' && c.dateOrder === 'ambiguous');

  const mappingKey = useDebounced(JSON.stringify(completeMapping(values)), 400);
  const mapping = useMemo(() => JSON.parse(mappingKey) as DatasetMapping | null, [mappingKey]);
  // Only analysts may ask for a preview; others see the counts saved with the mapping.
  const preview = useMappingPreview(dataset.id, canEdit ? mapping : null);

  const used = new Set(
    [values.employeeId, values.team, values.department, values.managerEmail].concat(
      values.outcomeKind === 'flag'
        ? [values.flagColumn]
        : [values.startDate, values.exitDate, values.exitReason],
    ),
  );
  const excludable = stored.filter((c) => !used.has(c.name)).map((c) => option(c.name));

  const onSubmit = form.handleSubmit((formValues) => {
    const body = completeMapping(formValues);
    if (body) save.mutate(body, { onSuccess: () => form.reset(formValues) });
  });

  return (
    <FormProvider {...form}>
      <form onSubmit={onSubmit} noValidate aria-label="Mapping" className="grid gap-6 lg:grid-cols-2">
        <fieldset disabled={!canEdit || save.isPending} className="min-w-0">
          <legend className="mb-3 text-base font-semibold text-slate-900">Columns</legend>
          <SelectField<MappingFormValues>
            name="employeeId"
            label="Employee ID"
            hint="One unique ID per person; stored only as a keyed hash."
            placeholder="Choose a column"
            options={of('identifier')}
          />
          <SelectField<MappingFormValues>
            name="team"
            label="Team"
            placeholder="Choose a column"
            options={of('category')}
          />
          <SelectField<MappingFormValues>
            name="department"
            label="Department (optional)"
            placeholder="None"
            options={of('category')}
          />
          <SelectField<MappingFormValues>
            name="managerEmail"
            label="Manager e-mail"
            hint="Matched to the signed-in manager to show their own teams."
            placeholder="Choose a column"
            options={of('category', 'identifier')}
          />
          {ambiguousDates && (
            <SelectField<MappingFormValues>
              name="dateOrder"
              label="Dates like 03/04/2025 mean"
              hint="Every date in at least one column fits both orders; say which the export uses."
              placeholder="Choose"
              options={[
                { value: 'dmy', label: 'day / month / year (3 April)' },
                { value: 'mdy', label: 'month / day / year (4 March)' },
              ]}
            />
          )}
          <CheckboxGroup<MappingFormValues>
            name="excluded"
            label="Leave out of the analysis"
            hint="The values of these columns are deleted when the mapping is saved."
            options={excludable}
          />
        </fieldset>

        <fieldset disabled={!canEdit || save.isPending} className="min-w-0">
          <legend className="mb-3 text-base font-semibold text-slate-900">Outcome: who left</legend>
          <SelectField<MappingFormValues>
            name="outcomeKind"
            label="Defined by"
            options={[
              { value: 'exit-dates', label: 'Start and leaving dates with a leaving reason' },
              { value: 'flag', label: 'A ready yes/no column' },
            ]}
          />
          {values.outcomeKind === 'flag' ? (
            <>
              <SelectField<MappingFormValues>
                name="flagColumn"
                label="Column"
                placeholder="Choose a column"
                options={of('yes-no', 'category')}
              />
              <CheckboxGroup<MappingFormValues>
                name="positiveValues"
                label="Values that mean the person left"
                options={valuesOf(values.flagColumn)}
              />
            </>
          ) : (
            <>
              <SelectField<MappingFormValues>
                name="startDate"
                label="Start date"
                placeholder="Choose a column"
                options={of('date')}
              />
              <SelectField<MappingFormValues>
                name="exitDate"
                label="Leaving date"
                placeholder="Choose a column"
                options={of('date')}
              />
              <SelectField<MappingFormValues>
                name="exitReason"
                label="Leaving reason"
                placeholder="Choose a column"
                options={of('category')}
              />
              <CheckboxGroup<MappingFormValues>
                name="voluntaryReasons"
                label="Reasons that count as voluntary"
                options={valuesOf(values.exitReason)}
              />
              <div className="grid grid-cols-2 gap-3">
                <TextField<MappingFormValues> name="windowStart" label="Window starts" type="date" />
                <TextField<MappingFormValues> name="windowEnd" label="Window ends" type="date" />
              </div>
            </>
          )}
        </fieldset>

        <section aria-label="Outcome preview" className="lg:col-span-2">
          <h3 className="mb-2 text-base font-semibold text-slate-900">Preview</h3>
          {!canEdit &&
            (dataset.preview ? (
              <OutcomePreviewPanel preview={dataset.preview} />
            ) : (
              <p className="text-sm text-slate-600">Not mapped yet.</p>
            ))}
          {canEdit && !mapping && (
            <p className="text-sm text-slate-600">Complete the mapping to see the outcome counts.</p>
          )}
          {canEdit && mapping && preview.isFetching && !preview.data && <ProgressBar label="Counting" />}
          {canEdit && mapping && preview.isError && (
            <IntakeProblems error={preview.error} title="This mapping cannot be used" />
          )}
          {canEdit && mapping && preview.data && !preview.isError && (
            <OutcomePreviewPanel preview={preview.data} />
          )}
        </section>

        {canEdit && (
          <div className="flex items-center gap-3 lg:col-span-2">
            <Button type="submit" busy={save.isPending}>
              Save mapping
            </Button>
            {save.isSuccess && !form.formState.isDirty && (
              <span className="text-sm text-moss-800">Saved.</span>
            )}
          </div>
        )}
        {save.isError && (
          <div className="lg:col-span-2">
            <IntakeProblems error={save.error} title="The mapping was not saved" />
          </div>
        )}
      </form>
    </FormProvider>
  );
}
