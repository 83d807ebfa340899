import {
  forwardRef,
  useId,
  useState,
  type InputHTMLAttributes,
  type ReactNode,
  type SelectHTMLAttributes,
} from 'react';
import { cn } from './cn';
import { IconChevronDown, IconEye, IconEyeOff, IconFail } from './icons';

/** The attributes FormField hands to its control so label, hint and error are wired up. */
export interface FieldControlProps {
  id: string;
  'aria-describedby'?: string;
  'aria-invalid'?: true;
}

export interface FormFieldProps {
  label: string;
  /** Help shown under the label, read out with the control. */
  hint?: ReactNode;
  /** The problem with the value and how to fix it; marks the control invalid. */
  error?: string;
  /** Use a given id for the control (otherwise one is generated). */
  id?: string;
  className?: string;
  children: (control: FieldControlProps) => ReactNode;
}

/**
 * A labelled control with its hint and error. The control gets `aria-describedby` pointing at
 * the error and the hint, and `aria-invalid` while there is an error, so a screen reader reads
 * the fix when the field is focused.
 */
export function FormField({ label, hint, error, id, className, children }: FormFieldProps) {
  const generated = useId();
  const controlId = id ?? `field-${generated}`;
  const hintId = `${controlId}-hint`;
  const errorId = `${controlId}-error`;
  const describedBy = [error ? errorId : null, hint ? hintId : null].filter(Boolean).join(' ') || undefined;

  return (
    <div className={cn('flex flex-col gap-1', className)}>
      <label htmlFor={controlId} className="font-bold">
        {label}
      </label>
      {hint && (
        <p id={hintId} className="text-sm text-ink-muted">
          {hint}
        </p>
      )}
      {children({ id: controlId, 'aria-describedby': describedBy, 'aria-invalid': error ? true : undefined })}
      {error && (
        <p id={errorId} className="flex items-start gap-1.5 text-sm font-bold text-fail">
          <IconFail size={18} className="mt-px shrink-0" />
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}

/** Class names shared by text inputs and selects. */
export function inputClasses(invalid: boolean, className?: string): string {
  return cn(
    'block w-full min-h-touch rounded-md border-2 bg-surface px-3 py-2 text-base text-ink',
    'placeholder:text-ink-muted disabled:cursor-not-allowed disabled:bg-sunk',
    invalid ? 'border-fail' : 'border-line-strong',
    className,
  );
}

type NativeInputProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'id'>;

export interface TextFieldProps extends NativeInputProps {
  label: string;
  hint?: ReactNode;
  error?: string;
  id?: string;
  /** Class names for the wrapping field. */
  fieldClassName?: string;
}

/** A labelled text input (also e-mail, number, search ...). */
export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField(
  { label, hint, error, id, fieldClassName, className, type = 'text', ...rest },
  ref,
) {
  return (
    <FormField label={label} hint={hint} error={error} id={id} className={fieldClassName}>
      {(control) => <input ref={ref} type={type} className={inputClasses(Boolean(error), className)} {...control} {...rest} />}
    </FormField>
  );
});

export type PasswordFieldProps = Omit<TextFieldProps, 'type'>;

/**
 * A password input with a Show/Hide toggle (people type these on tablets with greasy fingers).
 * The toggle's name avoids the word "password" so the field's label stays unique.
 */
export const PasswordField = forwardRef<HTMLInputElement, PasswordFieldProps>(function PasswordField(
  { label, hint, error, id, fieldClassName, className, ...rest },
  ref,
) {
  const [visible, setVisible] = useState(false);
  return (
    <FormField label={label} hint={hint} error={error} id={id} className={fieldClassName}>
      {(control) => (
        <div className="flex gap-2">
          <input
            ref={ref}
            type={visible ? 'text' : 'password'}
            className={inputClasses(Boolean(error), cn('flex-1', className))}
            autoCapitalize="none"
            autoCorrect="off"
            spellCheck={false}
            {...control}
            {...rest}
          />
          <button
            type="button"
            className="inline-flex min-h-touch min-w-touch items-center justify-center gap-1 rounded-md border-2 border-line-strong bg-surface px-3 text-sm font-bold text-ink hover:bg-sunk"
            aria-pressed={visible}
            aria-controls={control.id}
            onClick={() => setVisible((v) => !v)}
          >
            {visible ? <IconEyeOff size={18} /> : <IconEye size={18} />}
            <span>{visible ? 'Hide' : 'Show'}</span>
          </button>
        </div>
      )}
    </FormField>
  );
});

export interface SelectOption {
  value: string;
  label: string;
  disabled?: boolean;
}

export interface SelectProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: string;
  hint?: ReactNode;
  error?: string;
  id?: string;
  options: SelectOption[];
  /** A first, empty choice such as "Choose a role". */
  placeholder?: string;
  fieldClassName?: string;
}

/** A labelled native select: native keeps keyboard, touch and screen readers working everywhere. */
export const Select = forwardRef<HTMLSelectElement, SelectProps>(function Select(
  { label, hint, error, id, options, placeholder, fieldClassName, className, ...rest },
  ref,
) {
  return (
    <FormField label={label} hint={hint} error={error} id={id} className={fieldClassName}>
      {(control) => (
        <div className="relative">
          <select ref={ref} className={inputClasses(Boolean(error), cn('appearance-none pr-10', className))} {...control} {...rest}>
            {placeholder !== undefined && <option value="">{placeholder}</option>}
            {options.map((o) => (
              <option key={o.value} value={o.value} disabled={o.disabled}>
                {o.label}
              </option>
            ))}
          </select>
          <IconChevronDown className="pointer-events-none absolute top-1/2 right-3 -translate-y-1/2 text-ink-muted" />
        </div>
      )}
    </FormField>
  );
});

/** A form-level message (e.g. "Too many attempts"), announced when it appears. */
export function FormMessage({ tone = 'fail', children }: { tone?: 'fail' | 'ok'; children: ReactNode }) {
  return (
    <div
      role={tone === 'fail' ? 'alert' : 'status'}
      className={cn(
        'rounded-md border-2 p-3 font-bold',
        tone === 'fail' ? 'border-fail bg-fail-soft text-ink' : 'border-ok bg-ok-soft text-ink',
      )}
    >
      {children}
    </div>
  );
}
