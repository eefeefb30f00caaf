import { zodResolver } from '@hookform/resolvers/zod';
import { useEffect } from 'react';
import { FormProvider, type Path, useForm } from 'react-hook-form';
import {
  POLICY_LIMITS,
  type Policy,
  type PolicyUpdate,
  type PolicyUpdateInput,
  policyUpdateSchema,
} from '../../../../../shared/policy';
import { Button } from '../../../components/button';
import { ErrorNotice } from '../../../components/error-notice';
import { NumberField, TextField } from '../../../components/form-fields';
import { isApiError } from '../../../lib/api-client';
import { type BlockedFieldSuggestion, BlockedFieldsEditor } from './blocked-fields-editor';

export type PolicyFormProps = {
  policy: Policy;
  onSubmit: (update: PolicyUpdate) => Promise<unknown>;
  /** the privacy officer edits; everyone else reads */
  canEdit: boolean;
  suggestions?: readonly BlockedFieldSuggestion[];
  knownColumns?: readonly string[];
};

const FIELDS = ['k', 'blockedFields', 'proxyThreshold', 'retentionDays', 'reason'] as const;

function valuesOf(policy: Policy): PolicyUpdateInput {
  return {
    k: policy.k,
    blockedFields: policy.blockedFields,
    proxyThreshold: policy.proxyThreshold,
    retentionDays: policy.retentionDays,
    reason: '',
  };
}

/** The privacy policy's settings, each with what it means in plain words. */
export function PolicyForm({ policy, onSubmit, canEdit, suggestions, knownColumns }: PolicyFormProps) {
  const form = useForm<PolicyUpdateInput, unknown, PolicyUpdate>({
    resolver: zodResolver(policyUpdateSchema),
    defaultValues: valuesOf(policy),
  });
  const { reset, setError } = form;
  useEffect(() => reset(valuesOf(policy)), [policy, reset]);

  const submit = form.handleSubmit(async (update) => {
    try {
      await onSubmit(update);
    } catch (error) {
      // Put the server's per-field messages beside their fields as well.
      if (isApiError(error) && Array.isArray(error.details)) {
        for (const detail of error.details as { path?: string; message?: string }[]) {
          const field = FIELDS.find((f) => f === detail.path);
          if (field && detail.message)
            setError(field as Path<PolicyUpdateInput>, { message: detail.message });
        }
      }
      setError('root', { message: error instanceof Error ? error.message : 'The policy was not saved' });
    }
  });

  const blocked = form.watch('blockedFields') ?? [];
  const rootError = form.formState.errors.root;

  return (
    <FormProvider {...form}>
      <form onSubmit={submit} noValidate aria-label="Privacy policy">
        <NumberField<PolicyUpdateInput>
          name="k"
          label="Minimum group size (k)"
          min={POLICY_LIMITS.k.min}
          max={POLICY_LIMITS.k.max}
          step={1}
          disabled={!canEdit}
          hint={`No figure, team, band or segment about fewer than k employees is shown to anyone; where two shown figures could be subtracted to reveal a smaller group, one more is withheld. 5 is common practice in HR reporting; a larger k hides more. From ${POLICY_LIMITS.k.min} to ${POLICY_LIMITS.k.max}.`}
        />
        <BlockedFieldsEditor
          value={blocked}
          onChange={(fields) =>
            form.setValue('blockedFields', fields, { shouldDirty: true, shouldValidate: true })
          }
          suggestions={suggestions}
          knownColumns={knownColumns}
          disabled={!canEdit}
          error={form.formState.errors.blockedFields?.message}
        />
        <NumberField<PolicyUpdateInput>
          name="proxyThreshold"
          label="Proxy threshold (Cramér's V)"
          min={POLICY_LIMITS.proxyThreshold.min}
          max={POLICY_LIMITS.proxyThreshold.max}
          step={0.05}
          disabled={!canEdit}
          hint="An allowed column whose association with a blocked field reaches this strength is flagged as a possible stand-in for it (years since qualification can stand in for age). 0 is no association and 1 a perfect one; 0.1, 0.3 and 0.5 are conventionally small, medium and large. From 0.1 to 0.9."
        />
        <NumberField<PolicyUpdateInput>
          name="retentionDays"
          label="Retention (days)"
          min={POLICY_LIMITS.retentionDays.min}
          max={POLICY_LIMITS.retentionDays.max}
          step={1}
          disabled={!canEdit}
          hint="Datasets, and every model run and brief made from them, are deleted this many days after upload. From 30 to 3650."
        />
        {canEdit && (
          <>
            <TextField<PolicyUpdateInput>
              name="reason"
              label="Reason for the change"
              multiline
              hint="Kept with the new version and in the audit trail, e.g. “Works council agreement of 3 March”."
            />
            <p className="mb-4 text-sm text-slate-600">
              Saving makes version {policy.version + 1}. Dataset approvals and model runs made under an
              earlier version are marked for review; if k rises or a field a model used becomes blocked, its
              published briefs are withdrawn at once.
            </p>
            {rootError?.message && (
              <div className="mb-4">
                <ErrorNotice error={new Error(rootError.message)} title="The policy was not saved" />
              </div>
            )}
            <Button type="submit" busy={form.formState.isSubmitting}>
              Save as version {policy.version + 1}
            </Button>
          </>
        )}
      </form>
    </FormProvider>
  );
}
