import { zodResolver } from '@hookform/resolvers/zod';
import { useCallback, useId, useMemo, useRef } from 'react';
import type { BaseSyntheticEvent } from 'react';
import { get, useForm } from 'react-hook-form';
import type { FieldError, FieldErrors, FieldValues, Resolver, ResolverResult, UseFormRegister, UseFormReturn } from 'react-hook-form';
import type { z } from 'zod';
import { FORM_ERROR, applyServerErrors, flattenFieldValues, friendlyIssueMessage } from './server-errors';

export interface SchemaFormOptions<TSchema extends z.core.$ZodType> {
  /**
   * The shared body schema from shared/schemas, or a feature's form schema that reads the typed text
   * (by field path) into that body and pipes it into the shared schema.
   */
  schema: TSchema;
  /** Values the person does not type (a token from the address, rows kept outside the inputs). */
  extraValues?: Record<string, unknown>;
  onSubmit: (values: z.output<TSchema>, helpers: { reset: () => void }) => Promise<unknown> | unknown;
  /** Where a server detail's path lands on this form, when the form names it otherwise. */
  serverPath?: (path: string) => string | null;
  /**
   * Paths of inputs whose values live in React state and reach the schema through `extraValues`
   * (rows added and removed on the form); they show their own errors with `fieldError`.
   */
  statePaths?: (path: string) => boolean;
}

export interface SchemaForm {
  /** Prefix of the ids of the form's inputs, hints and errors. */
  id: string;
  methods: UseFormReturn<FieldValues>;
  register: UseFormRegister<FieldValues>;
  submit: (event?: BaseSyntheticEvent) => Promise<void>;
  submitting: boolean;
  /** What the server or the schema said that belongs to no single field. */
  formError: string | null;
  /** The message on a field or group, by its path. */
  fieldError: (name: string) => string | undefined;
  /** Clears a field's error as the person changes it (inputs kept in React state). */
  clearFieldError: (name: string) => void;
  /** A group of inputs (a fieldset) whose own path can carry an error; registered by FieldGroup. */
  addGroup: (name: string) => () => void;
}

/** The leaf errors of RHF's nested error object, by dotted path. */
function leafErrors(errors: FieldErrors, prefix = '', into: [string, FieldError][] = []): [string, FieldError][] {
  for (const [key, value] of Object.entries(errors)) {
    if (!value || typeof value !== 'object' || key === 'ref') continue;
    const path = prefix ? `${prefix}.${key}` : key;
    if (typeof (value as FieldError).type === 'string') into.push([path, value as FieldError]);
    else leafErrors(value as FieldErrors, path, into);
  }
  return into;
}

/**
 * The one form pattern: react-hook-form over a zod schema (the same one the server validates with),
 * uncontrolled inputs registered by their field path, and the server's 422 field errors put back on
 * the same fields with setError. Errors about no field on the form show in the form's error area.
 */
export function useSchemaForm<TSchema extends z.core.$ZodType>({ schema, extraValues, onSubmit, serverPath, statePaths }: SchemaFormOptions<TSchema>): SchemaForm {
  const id = useId();
  const groups = useRef(new Set<string>());

  const resolver = useMemo<Resolver<FieldValues>>(() => {
    const parse = zodResolver(schema as unknown as z.core.$ZodType<unknown, FieldValues>, { error: friendlyIssueMessage });
    return async (values, context, options) => {
      const input = { ...flattenFieldValues(values), ...extraValues };
      const result = (await parse(input, context, options)) as ResolverResult<FieldValues>;
      const names = new Set<string>(options.names ?? []);
      const known = (path: string) => names.has(path) || groups.current.has(path) || Boolean(statePaths?.(path));
      const loose = leafErrors(result.errors).filter(([path]) => !known(path));
      if (loose.length === 0) return result;
      const message = loose.map(([path, error]) => (path ? `${path}: ${error.message}` : error.message)).join(' ');
      const errors = { ...result.errors, [FORM_ERROR]: { type: 'schema', message } } as FieldErrors;
      return { values: {}, errors };
    };
  }, [schema, extraValues, statePaths]);

  const methods = useForm<FieldValues>({ resolver, shouldUnregister: true });
  const { errors, isSubmitting } = methods.formState;

  // handleSubmit is called from the event, not during render, so the group names are read only on submit.
  const submit = useCallback(
    (event?: BaseSyntheticEvent) =>
      methods.handleSubmit(async (values) => {
        try {
          await onSubmit(values as z.output<TSchema>, { reset: () => methods.reset() });
        } catch (error) {
          applyServerErrors(methods, error, {
            isField: (path) => methods.control._names.mount.has(path) || groups.current.has(path) || Boolean(statePaths?.(path)),
            serverPath,
          });
        }
      })(event),
    [methods, onSubmit, serverPath, statePaths],
  );

  const addGroup = useCallback((name: string) => {
    groups.current.add(name);
    return () => {
      groups.current.delete(name);
    };
  }, []);

  const fieldError = (name: string): string | undefined => (get(errors, name) as FieldError | undefined)?.message;
  const formError = (errors[FORM_ERROR]?.message as string | undefined) ?? errors.root?.server?.message ?? null;

  const clearFieldError = (name: string) => methods.clearErrors(name);

  return { id, methods, register: methods.register, submit, submitting: isSubmitting, formError, fieldError, clearFieldError, addGroup };
}
