import { type ReactNode, useId } from 'react';
import { type FieldError, type FieldValues, get, type Path, useFormContext } from 'react-hook-form';

/*
 * Field wrappers for react-hook-form. Put them inside a <FormProvider {...form}> whose form uses
 * zodResolver(schema): each field registers itself by `name` and shows the zod message for it.
 */

type BaseFieldProps<T extends FieldValues> = {
  name: Path<T>;
  label: string;
  /** one line of help under the label */
  hint?: ReactNode;
  disabled?: boolean;
};

const inputClass =
  'mt-1 block w-full rounded-md border border-slate-300 bg-white px-3 py-2 text-sm text-slate-900 disabled:bg-slate-100 aria-[invalid=true]:border-signal-600';

function useFieldError(name: string): string | undefined {
  const { formState } = useFormContext();
  const error = get(formState.errors, name) as FieldError | undefined;
  return error?.message ? String(error.message) : undefined;
}

type FieldFrameProps = {
  id: string;
  label: string;
  hint?: ReactNode;
  error?: string;
  children: ReactNode;
};

function FieldFrame({ id, label, hint, error, children }: FieldFrameProps) {
  return (
    <div className="mb-4">
      <label htmlFor={id} className="block text-sm font-medium text-slate-800">
        {label}
      </label>
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-slate-500">
          {hint}
        </p>
      )}
      {children}
      {error && (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-signal-700">
          {error}
        </p>
      )}
    </div>
  );
}

function describedBy(id: string, hint: unknown, error: unknown): string | undefined {
  const ids = [hint ? `${id}-hint` : '', error ? `${id}-error` : ''].filter(Boolean);
  return ids.length ? ids.join(' ') : undefined;
}

export type TextFieldProps<T extends FieldValues> = BaseFieldProps<T> & {
  type?: 'text' | 'email' | 'date' | 'search';
  placeholder?: string;
  /** a multi-line text box */
  multiline?: boolean;
};

export function TextField<T extends FieldValues>({
  name,
  label,
  hint,
  disabled,
  type = 'text',
  placeholder,
  multiline,
}: TextFieldProps<T>) {
  const id = useId();
  const { register } = useFormContext<T>();
  const error = useFieldError(name);
  const common = {
    id,
    disabled,
    placeholder,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': describedBy(id, hint, error),
    className: inputClass,
    ...register(name),
  };
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error}>
      {multiline ? <textarea rows={3} {...common} /> : <input type={type} {...common} />}
    </FieldFrame>
  );
}

export type NumberFieldProps<T extends FieldValues> = BaseFieldProps<T> & {
  min?: number;
  max?: number;
  step?: number | 'any';
};

/** Registers with `valueAsNumber`, so the form value is a number (NaN when empty). */
export function NumberField<T extends FieldValues>({
  name,
  label,
  hint,
  disabled,
  min,
  max,
  step,
}: NumberFieldProps<T>) {
  const id = useId();
  const { register } = useFormContext<T>();
  const error = useFieldError(name);
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error}>
      <input
        id={id}
        type="number"
        inputMode="decimal"
        min={min}
        max={max}
        step={step}
        disabled={disabled}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={`${inputClass} tabular-nums`}
        {...register(name, { valueAsNumber: true })}
      />
    </FieldFrame>
  );
}

export type FieldOption = {
  value: string;
  label: string;
  disabled?: boolean;
  /** why the option is locked, or any short remark shown beside it */
  note?: string;
};

export type SelectFieldProps<T extends FieldValues> = BaseFieldProps<T> & {
  options: readonly FieldOption[];
  /** an empty first choice, e.g. "Choose a column" */
  placeholder?: string;
};

export function SelectField<T extends FieldValues>({
  name,
  label,
  hint,
  disabled,
  options,
  placeholder,
}: SelectFieldProps<T>) {
  const id = useId();
  const { register } = useFormContext<T>();
  const error = useFieldError(name);
  return (
    <FieldFrame id={id} label={label} hint={hint} error={error}>
      <select
        id={id}
        disabled={disabled}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={inputClass}
        {...register(name)}
      >
        {placeholder !== undefined && <option value="">{placeholder}</option>}
        {options.map((option) => (
          <option key={option.value} value={option.value} disabled={option.disabled}>
            {option.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}

export type CheckboxGroupProps<T extends FieldValues> = BaseFieldProps<T> & {
  options: readonly FieldOption[];
};

/** Several checkboxes under one name; the form value is the array of checked values. */
export function CheckboxGroup<T extends FieldValues>({
  name,
  label,
  hint,
  disabled,
  options,
}: CheckboxGroupProps<T>) {
  const id = useId();
  const { register } = useFormContext<T>();
  const error = useFieldError(name);
  return (
    <fieldset
      className="mb-4"
      aria-describedby={describedBy(id, hint, error)}
      aria-invalid={error ? true : undefined}
    >
      <legend className="text-sm font-medium text-slate-800">{label}</legend>
      {hint && (
        <p id={`${id}-hint`} className="text-xs text-slate-500">
          {hint}
        </p>
      )}
      <div className="mt-1 grid gap-1 sm:grid-cols-2">
        {options.map((option) => (
          <label
            key={option.value}
            className={`flex items-start gap-2 text-sm ${option.disabled ? 'text-slate-500' : 'text-slate-800'}`}
          >
            <input
              type="checkbox"
              value={option.value}
              disabled={disabled || option.disabled}
              className="mt-0.5 h-4 w-4 accent-moss-700"
              {...register(name)}
            />
            <span>
              {option.label}
              {option.note && <span className="block text-xs text-slate-500">{option.note}</span>}
            </span>
          </label>
        ))}
      </div>
      {error && (
        <p id={`${id}-error`} className="mt-1 text-sm font-medium text-signal-700">
          {error}
        </p>
      )}
    </fieldset>
  );
}
