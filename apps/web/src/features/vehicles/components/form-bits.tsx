import { FormField, inputClasses } from '@tappet/ui';
import type { TextareaHTMLAttributes } from 'react';

/** A labelled multi-line text field, wired like the design system's TextField. */
export function TextAreaField({ label, hint, error, ...rest }: Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id'> & { label: string; hint?: string; error?: string }) {
  return (
    <FormField label={label} hint={hint} error={error}>
      {(control) => <textarea rows={3} className={inputClasses(Boolean(error), 'min-h-24')} {...control} {...rest} />}
    </FormField>
  );
}

/** An optional text input: empty means "none". */
export function blankToNull(value: string | undefined): string | null {
  const trimmed = value?.trim() ?? '';
  return trimmed ? trimmed : null;
}

/** An optional whole number typed in a text field: empty means none; anything else goes to the schema to judge. */
export function optionalInteger(value: string | undefined): number | null {
  const trimmed = value?.trim() ?? '';
  if (!trimmed) return null;
  const n = Number(trimmed.replace(/[,\s]/g, ''));
  return Number.isFinite(n) ? n : Number.NaN;
}
