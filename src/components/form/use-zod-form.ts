import { useCallback, useEffect, useId, useRef, useState } from 'react';
import type { FormEvent } from 'react';
import type { z } from 'zod';
import { friendlyIssueMessage, issuesToFormErrors, serverErrorToFormErrors } from './form-errors';

export interface ZodFormOptions<TSchema extends z.ZodType> {
  /** The body schema from shared/schemas: the same one the server validates with. */
  schema: TSchema;
  /** Values the person does not type (a token from the address). */
  extraValues?: Record<string, unknown>;
  onSubmit: (values: z.output<TSchema>, helpers: { reset: () => void }) => Promise<unknown> | unknown;
}

export interface ZodForm {
  id: string;
  handleSubmit: (event: FormEvent<HTMLFormElement>) => void;
  fieldErrors: Record<string, string>;
  formError: string | null;
  submitting: boolean;
  clearFieldError: (name: string) => void;
}

function readForm(form: HTMLFormElement): { values: Record<string, unknown>; names: Set<string> } {
  const values: Record<string, unknown> = {};
  const names = new Set<string>();
  for (const element of Array.from(form.elements)) {
    const name = (element as HTMLInputElement).name;
    if (name) names.add(name);
  }
  for (const [key, value] of new FormData(form).entries()) {
    if (typeof value === 'string') values[key] = value;
  }
  return { values, names };
}

function focusFirstInvalid(form: HTMLFormElement, fields: Record<string, string>): void {
  const first = Array.from(form.elements).find((element) => (element as HTMLInputElement).name in fields);
  (first as HTMLElement | undefined)?.focus();
}

/**
 * The one form pattern: uncontrolled inputs read on submit, checked with the shared zod body
 * schema, and server errors mapped back onto the same fields by path.
 */
export function useZodForm<TSchema extends z.ZodType>({ schema, extraValues, onSubmit }: ZodFormOptions<TSchema>): ZodForm {
  const id = useId();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [submitting, setSubmitting] = useState(false);
  const mounted = useRef(true);
  useEffect(() => {
    mounted.current = true;
    return () => {
      mounted.current = false;
    };
  }, []);

  const handleSubmit = useCallback(
    (event: FormEvent<HTMLFormElement>) => {
      event.preventDefault();
      const formElement = event.currentTarget;
      const { values, names } = readForm(formElement);
      const parsed = schema.safeParse({ ...values, ...extraValues }, { error: friendlyIssueMessage });
      if (!parsed.success) {
        const errors = issuesToFormErrors(parsed.error.issues, names);
        setFieldErrors(errors.fields);
        setFormError(errors.form);
        focusFirstInvalid(formElement, errors.fields);
        return;
      }
      setFieldErrors({});
      setFormError(null);
      setSubmitting(true);
      Promise.resolve()
        .then(() => onSubmit(parsed.data, { reset: () => formElement.reset() }))
        .catch((error: unknown) => {
          if (!mounted.current) return;
          const errors = serverErrorToFormErrors(error, names);
          setFieldErrors(errors.fields);
          setFormError(errors.form);
          focusFirstInvalid(formElement, errors.fields);
        })
        .finally(() => {
          if (mounted.current) setSubmitting(false);
        });
    },
    [schema, extraValues, onSubmit],
  );

  const clearFieldError = useCallback((name: string) => {
    setFieldErrors((errors) => {
      if (!(name in errors)) return errors;
      const rest = { ...errors };
      delete rest[name];
      return rest;
    });
  }, []);

  return { id, handleSubmit, fieldErrors, formError, submitting, clearFieldError };
}
