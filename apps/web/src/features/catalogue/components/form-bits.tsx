import { FormField, inputClasses } from '@tappet/ui';
import type { TextareaHTMLAttributes } from 'react';
import { ApiError } from '../../../lib/api-client';
import type { FieldErrors } from '../../../lib/forms';

/** A labelled multi-line text field (notes), wired like the design system's TextField. */
export function TextAreaField({
  label,
  hint,
  error,
  ...rest
}: Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id'> & { label: string; hint?: string; error?: string }) {
  return (
    <FormField label={label} hint={hint} error={error}>
      {(control) => <textarea rows={3} className={inputClasses(Boolean(error), 'min-h-24')} {...control} {...rest} />}
    </FormField>
  );
}

/** "supplierNumbers.2" → "supplierNumbers": one message next to a field that holds a list. */
export function collapseListErrors(errors: FieldErrors, listFields: readonly string[]): FieldErrors {
  const out: FieldErrors = {};
  for (const [key, message] of Object.entries(errors)) {
    const list = listFields.find((f) => key.startsWith(`${f}.`));
    const target = list ?? key;
    if (!(target in out)) out[target] = message;
  }
  return out;
}

/** The same ApiError with list-item field errors gathered onto their list field. */
export function collapseApiListErrors(error: unknown, listFields: readonly string[]): unknown {
  if (!(error instanceof ApiError)) return error;
  return new ApiError(error.status, error.code, error.message, collapseListErrors(error.fieldErrors, listFields), error.details);
}

/** An optional text input: empty means "none". */
export function blankToNull(value: string | undefined): string | null {
  const trimmed = value?.trim() ?? '';
  return trimmed ? trimmed : null;
}

/** An optional whole number typed in a text field: empty means "none"; anything else is checked by the schema. */
export function optionalNumber(value: string | undefined): number | null | string {
  const trimmed = value?.trim() ?? '';
  if (!trimmed) return null;
  const n = Number(trimmed);
  // Hand the schema something it will refuse with its own message, rather than NaN.
  return Number.isFinite(n) ? n : trimmed;
}

/** Problems found before sending, shaped like the API's validation error so both show the same way. */
export function localValidationError(fieldErrors: FieldErrors): ApiError {
  return new ApiError(400, 'validation_failed', 'Check the fields marked below.', fieldErrors);
}
