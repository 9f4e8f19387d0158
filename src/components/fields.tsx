import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { useController, type Control, type FieldPath, type FieldValues } from 'react-hook-form';
import { cx } from '@/lib/cx';

const fieldClass =
  'block w-full min-h-11 rounded-control border bg-surface px-3 py-2 text-base text-ink ' +
  'placeholder:text-ink-muted disabled:opacity-60';

interface FieldShellProps {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  children: ReactNode;
  className?: string;
}

function FieldShell({ id, label, hint, error, children, className }: FieldShellProps) {
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="font-medium text-ink">
        {label}
      </label>
      {children}
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="flex items-start gap-1 text-sm font-medium text-bad">
          <span aria-hidden="true">✗</span>
          <span>{error}</span>
        </p>
      ) : null}
    </div>
  );
}

function describedBy(id: string, hint: unknown, error: unknown) {
  const ids = [hint ? `${id}-hint` : '', error ? `${id}-error` : ''].filter(Boolean);
  return ids.length ? ids.join(' ') : undefined;
}

/**
 * What a text, select or text-area field shares: an id, the react-hook-form binding, the
 * error message, and the props that tie the control to its label, hint and error.
 */
function useBoundField<T extends FieldValues>(control: Control<T>, name: FieldPath<T>, id: string | undefined, hint: unknown, disabledProp: boolean | undefined) {
  const autoId = useId();
  const fieldId = id ?? `f${autoId}`;
  const {
    field: { ref, name: fieldName, value, onChange, onBlur, disabled },
    fieldState,
  } = useController({ control, name });
  const error = fieldState.error?.message;
  return {
    fieldId,
    error,
    border: error ? 'border-bad border-2' : 'border-field',
    bind: {
      id: fieldId,
      name: fieldName,
      ref,
      value: value ?? '',
      onChange,
      onBlur,
      disabled: disabled || disabledProp,
      'aria-invalid': error ? true : undefined,
      'aria-describedby': describedBy(fieldId, hint, error),
    },
  };
}

type TextFieldProps<T extends FieldValues> = {
  control: Control<T>;
  name: FieldPath<T>;
  label: ReactNode;
  hint?: ReactNode;
  className?: string;
} & Omit<InputHTMLAttributes<HTMLInputElement>, 'name' | 'value' | 'defaultValue' | 'onChange' | 'onBlur'>;

/**
 * A labelled text input bound to a react-hook-form field; shows its error
 * under it (with a cross, not colour alone).
 *   <TextField control={form.control} name="email" label="E-mail" type="email" autoComplete="email" />
 */
export function TextField<T extends FieldValues>({ control, name, label, hint, className, id, ...input }: TextFieldProps<T>) {
  const { fieldId, error, border, bind } = useBoundField(control, name, id, hint, input.disabled);
  return (
    <FieldShell id={fieldId} label={label} hint={hint} error={error} className={className}>
      <input
        {...input}
        {...bind}
        className={cx(fieldClass, border)}
      />
    </FieldShell>
  );
}

export interface SelectOption {
  value: string;
  label: string;
}

type SelectFieldProps<T extends FieldValues> = {
  control: Control<T>;
  name: FieldPath<T>;
  label: ReactNode;
  options: readonly SelectOption[];
  hint?: ReactNode;
  className?: string;
} & Omit<SelectHTMLAttributes<HTMLSelectElement>, 'name' | 'value' | 'defaultValue' | 'onChange' | 'onBlur'>;

/** A labelled native select bound to a react-hook-form field. */
export function SelectField<T extends FieldValues>({ control, name, label, options, hint, className, id, ...select }: SelectFieldProps<T>) {
  const { fieldId, error, border, bind } = useBoundField(control, name, id, hint, select.disabled);
  return (
    <FieldShell id={fieldId} label={label} hint={hint} error={error} className={className}>
      <select
        {...select}
        {...bind}
        className={cx(fieldClass, border)}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldShell>
  );
}

type TextAreaFieldProps<T extends FieldValues> = {
  control: Control<T>;
  name: FieldPath<T>;
  label: ReactNode;
  hint?: ReactNode;
  className?: string;
} & Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'name' | 'value' | 'defaultValue' | 'onChange' | 'onBlur'>;

/** A labelled multi-line text box bound to a react-hook-form field (complaint, cause, correction, notes). */
export function TextAreaField<T extends FieldValues>({ control, name, label, hint, className, id, rows = 4, ...area }: TextAreaFieldProps<T>) {
  const { fieldId, error, border, bind } = useBoundField(control, name, id, hint, area.disabled);
  return (
    <FieldShell id={fieldId} label={label} hint={hint} error={error} className={className}>
      <textarea
        {...area}
        rows={rows}
        {...bind}
        className={cx(fieldClass, 'resize-y', border)}
      />
    </FieldShell>
  );
}

type CheckboxFieldProps<T extends FieldValues> = {
  control: Control<T>;
  name: FieldPath<T>;
  label: ReactNode;
  hint?: ReactNode;
  className?: string;
  disabled?: boolean;
};

/** A checkbox with its label, bound to a boolean react-hook-form field; the whole row is the 44 px target. */
export function CheckboxField<T extends FieldValues>({ control, name, label, hint, className, disabled: off }: CheckboxFieldProps<T>) {
  const autoId = useId();
  const fieldId = `f${autoId}`;
  const {
    field: { ref, name: fieldName, value, onChange, onBlur, disabled },
    fieldState,
  } = useController({ control, name });
  const error = fieldState.error?.message;
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={fieldId} className="flex min-h-11 cursor-pointer items-center gap-3">
        <input
          id={fieldId}
          type="checkbox"
          name={fieldName}
          ref={ref}
          checked={Boolean(value)}
          onChange={(e) => onChange(e.target.checked)}
          onBlur={onBlur}
          disabled={disabled || off}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(fieldId, hint, error)}
          className="size-5 shrink-0 accent-(--ww-accent)"
        />
        <span className="font-medium">{label}</span>
      </label>
      {hint ? (
        <p id={`${fieldId}-hint`} className="pl-8 text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${fieldId}-error`} className="flex items-start gap-1 pl-8 text-sm font-medium text-bad">
          <span aria-hidden="true">✗</span>
          <span>{error}</span>
        </p>
      ) : null}
    </div>
  );
}
