import type { FieldValues, UseFormReturn } from 'react-hook-form';
import type { z } from 'zod';
import { isApiError } from '../../lib/api-client';

/** Key of the error that belongs to no field on the form (a schema rule about the whole body). */
export const FORM_ERROR = '_form';

/** Plain words for the checks a schema leaves to zod's defaults. */
export const friendlyIssueMessage = (issue: z.core.$ZodRawIssue): string | undefined => {
  if (issue.code === 'invalid_type' && (issue.input === undefined || issue.input === '')) return 'This field is required';
  if (issue.code === 'invalid_value') return 'Choose one of the options';
  return undefined;
};

/**
 * The form's values by field path ("lines.2.quantity" → "4"), as a browser would post the form:
 * a ticked box without a value is "on", an unticked box, an unchosen radio and an unmounted field are
 * left out; the files of a file input stay a list. The form schemas read this, so a field's name is
 * the path its errors come back on.
 */
export function flattenFieldValues(values: unknown, prefix = '', into: Record<string, unknown> = {}): Record<string, unknown> {
  if (values === null || values === undefined || values === false) return into;
  if (values === true) {
    into[prefix] = 'on';
    return into;
  }
  // A file input gives a list of files: it stays a list under its own name.
  const files = typeof FileList !== 'undefined' && values instanceof FileList ? Array.from(values) : null;
  if (files || (Array.isArray(values) && values.length > 0 && values.every((v) => v instanceof Blob))) {
    into[prefix] = files ?? values;
    return into;
  }
  if (typeof values === 'object' && !(values instanceof Blob) && !(values instanceof Date)) {
    // Object.entries skips the holes of a sparse array (fields named `weekday.6` with none before).
    for (const [key, value] of Object.entries(values)) flattenFieldValues(value, prefix ? `${prefix}.${key}` : key, into);
    return into;
  }
  into[prefix] = typeof values === 'number' ? String(values) : values;
  return into;
}

export interface ServerErrorOptions {
  /** Whether a path names a field or group on this form. */
  isField: (path: string) => boolean;
  /** Where a detail's path lands on this form, when the form names it otherwise (null: nowhere). */
  serverPath?: (path: string) => string | null;
}

/**
 * Puts a failed submission on the form: a 422's details (`{ path, message }`) go onto the fields
 * their paths name with setError (nested paths like `lines.2.quantity` too), the first one focused;
 * anything else (and details naming no field here) goes to the form's error area (`root.server`).
 */
export function applyServerErrors<T extends FieldValues>(form: UseFormReturn<T>, error: unknown, { isField, serverPath }: ServerErrorOptions): void {
  const setError = form.setError as (name: string, error: { type: string; message: string }, options?: { shouldFocus: boolean }) => void;
  if (!isApiError(error)) {
    setError('root.server', { type: 'server', message: 'Something went wrong. Try again in a moment.' });
    return;
  }
  if (error.status !== 422 || error.details.length === 0) {
    setError('root.server', { type: 'server', message: error.message });
    return;
  }
  const placed = new Set<string>();
  const loose: string[] = [];
  for (const detail of error.details) {
    const path = detail.path ? (serverPath ? serverPath(detail.path) : detail.path) : null;
    if (path && isField(path)) {
      if (!placed.has(path)) setError(path, { type: 'server', message: detail.message }, { shouldFocus: placed.size === 0 });
      placed.add(path);
    } else {
      loose.push(detail.path ? `${detail.path}: ${detail.message}` : detail.message);
    }
  }
  const message = loose.length ? loose.join(' ') : placed.size ? 'Check the fields marked below.' : error.message;
  setError('root.server', { type: 'server', message });
}
