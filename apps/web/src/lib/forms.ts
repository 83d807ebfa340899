import { useEffect, useRef, useState, type RefObject } from 'react';
import type { z } from 'zod';
import { ApiError } from './api-client';

export type FieldErrors = Record<string, string>;

/** First message per field from a zod error (top-level field names). */
export function zodFieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join('.');
    if (key && !(key in out)) out[key] = issue.message;
  }
  return out;
}

/** Reads a form's named string fields into an object. */
export function formValues(form: HTMLFormElement): Record<string, string> {
  const out: Record<string, string> = {};
  new FormData(form).forEach((value, key) => {
    if (typeof value === 'string') out[key] = value;
  });
  return out;
}

export interface FormErrorsState {
  fieldErrors: FieldErrors;
  /** A message about the whole form (rate limit, wrong credentials, network). */
  formError: string | null;
}

/**
 * Error state for a form: field errors from zod or from the API's validation details, a form
 * message for everything else, and focus moved to the first invalid field after each failed
 * submit (the field's error is then read out with it).
 */
export function useFormErrors(formRef: RefObject<HTMLFormElement | null>) {
  const [state, setState] = useState<FormErrorsState>({ fieldErrors: {}, formError: null });
  const [attempt, setAttempt] = useState(0);
  const focusPending = useRef(false);

  useEffect(() => {
    if (!focusPending.current) return;
    focusPending.current = false;
    formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [attempt, formRef]);

  function fail(fieldErrors: FieldErrors, formError: string | null = null) {
    focusPending.current = Object.keys(fieldErrors).length > 0;
    setState({ fieldErrors, formError });
    setAttempt((n) => n + 1);
  }

  return {
    ...state,
    clear: () => setState({ fieldErrors: {}, formError: null }),
    /** Shows the problems of a zod parse. */
    failValidation: (error: z.ZodError) => fail(zodFieldErrors(error)),
    /**
     * Shows an API error: field errors next to the fields named in `fields`, anything else as
     * the form message.
     */
    failApi: (error: unknown, fields: readonly string[], fallback = 'That did not work. Try again.') => {
      if (error instanceof ApiError) {
        const known = Object.fromEntries(Object.entries(error.fieldErrors).filter(([k]) => fields.includes(k)));
        const hasKnown = Object.keys(known).length > 0;
        fail(known, hasKnown ? null : error.message);
      } else {
        fail({}, fallback);
      }
    },
  };
}
