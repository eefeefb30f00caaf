import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { FormProvider, useForm } from 'react-hook-form';
import type { DatasetSummary } from '../../../../../shared/datasets';
import {
  CRITERIA,
  type FeatureOptions,
  MODEL_LIMITS,
  type ModelRunRequest,
  type ModelRunRequestInput,
  modelRunRequestSchema,
} from '../../../../../shared/models';
import { Button } from '../../../components/button';
import { ErrorNotice } from '../../../components/error-notice';
import { CheckboxGroup, NumberField, SelectField } from '../../../components/form-fields';

export type RunFormProps = {
  datasets: readonly DatasetSummary[];
  /** the chosen dataset's feature list under the current policy, once loaded */
  featureOptions?: FeatureOptions;
  /** allowed features that stand in for a blocked field: feature → note */
  proxies?: Record<string, string>;
  /** the policy's k while no dataset is chosen */
  k?: number;
  initialDatasetId?: string;
  onDatasetChange: (datasetId: string) => void;
  onSubmit: (body: ModelRunRequest) => Promise<unknown>;
  error?: unknown;
};

export function RunForm({
  datasets,
  featureOptions,
  proxies = {},
  k,
  initialDatasetId = '',
  onDatasetChange,
  onSubmit,
  error,
}: RunFormProps) {
  const form = useForm<ModelRunRequestInput, unknown, ModelRunRequest>({
    resolver: zodResolver(modelRunRequestSchema),
    defaultValues: {
      datasetId: initialDatasetId,
      criterion: 'gini',
      maxDepth: 6,
      minLeaf: 25,
      classWeight: 'none',
      pruning: 'cv',
      folds: 5,
      seed: 1,
      features: [],
    },
  });
  const datasetId = form.watch('datasetId');
  useEffect(() => onDatasetChange(datasetId ?? ''), [datasetId, onDatasetChange]);

  // Every allowed feature starts ticked; blocked ones cannot be.
  useEffect(() => {
    if (!featureOptions) return;
    form.setValue(
      'features',
      featureOptions.features.filter((f) => !f.blocked).map((f) => f.name),
    );
  }, [featureOptions, form]);

  const policyK = featureOptions?.k ?? k;
  const submit = form.handleSubmit(async (body) => {
    await onSubmit({ ...body, features: body.features?.length ? body.features : undefined });
  });

  return (
    <FormProvider {...form}>
      <form onSubmit={submit} noValidate aria-label="New model run" className="max-w-3xl">
        <SelectField<ModelRunRequestInput>
          name="datasetId"
          label="Dataset"
          placeholder="Choose a dataset"
          options={datasets.map((d) => ({
            value: d.id,
            label: `${d.name} (${d.rowCount} rows, ${d.status})`,
          }))}
        />
        <div className="grid gap-x-6 sm:grid-cols-2">
          <SelectField<ModelRunRequestInput>
            name="criterion"
            label="Split criterion"
            hint={`Gini: ${CRITERIA.gini.split(': ')[1]} Entropy: ${CRITERIA.entropy.split(': ')[1]}`}
            options={[
              { value: 'gini', label: 'Gini impurity' },
              { value: 'entropy', label: 'Entropy (information gain)' },
            ]}
          />
          <NumberField<ModelRunRequestInput>
            name="maxDepth"
            label="Maximum depth"
            min={MODEL_LIMITS.maxDepth.min}
            max={MODEL_LIMITS.maxDepth.max}
            step={1}
            hint="How many questions at most on the way from the top to a segment."
          />
          <NumberField<ModelRunRequestInput>
            name="minLeaf"
            label="Minimum employees per segment"
            min={MODEL_LIMITS.minLeaf.min}
            max={MODEL_LIMITS.minLeaf.max}
            step={1}
            hint={
              policyK === undefined
                ? 'Never below the privacy policy’s k.'
                : `Never below k = ${policyK}: a smaller value is raised to it.`
            }
          />
          <SelectField<ModelRunRequestInput>
            name="classWeight"
            label="Class weights"
            hint="Balanced weighs leavers and stayers equally, so that rare leavers still shape the tree."
            options={[
              { value: 'none', label: 'None (as in the data)' },
              { value: 'balanced', label: 'Balanced' },
            ]}
          />
          <SelectField<ModelRunRequestInput>
            name="pruning"
            label="Pruning"
            hint="Cross-validated pruning keeps the simplest tree within one standard error of the best."
            options={[
              { value: 'cv', label: 'Cross-validated' },
              { value: 'none', label: 'None' },
            ]}
          />
          <NumberField<ModelRunRequestInput>
            name="folds"
            label="Cross-validation folds"
            min={MODEL_LIMITS.folds.min}
            max={MODEL_LIMITS.folds.max}
            step={1}
          />
          <NumberField<ModelRunRequestInput>
            name="seed"
            label="Seed"
            min={MODEL_LIMITS.seed.min}
            step={1}
            hint="The same seed and settings train the same tree again."
          />
        </div>
        {featureOptions && (
          <CheckboxGroup<ModelRunRequestInput>
            name="features"
            label="Features"
            hint="Blocked fields and anything derived from them are locked out by the privacy policy; proxies are allowed fields strongly associated with a blocked one."
            options={featureOptions.features.map((f) => ({
              value: f.name,
              label: f.blocked ? `${f.name} (locked)` : proxies[f.name] ? `${f.name} (proxy)` : f.name,
              disabled: f.blocked !== null,
              note: f.blocked ? `Blocked: ${f.blocked}` : proxies[f.name],
            }))}
          />
        )}
        {error ? <ErrorNotice error={error} title="The run could not start" /> : null}
        <Button type="submit" busy={form.formState.isSubmitting}>
          Start the run
        </Button>
      </form>
    </FormProvider>
  );
}
