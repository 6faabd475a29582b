import type { z } from 'zod';
import { isApiError } from '../../lib/api-client';

export interface FormErrors {
  fields: Record<string, string>;
  /** Problems that belong to no field on the form; shown in the form's error area. */
  form: string | null;
}

/** First message per field path ("email", "address.town"), as zod reports them. */
export function issuesToFormErrors(issues: readonly z.core.$ZodIssue[], fieldNames: ReadonlySet<string>): FormErrors {
  const fields: Record<string, string> = {};
  const loose: string[] = [];
  for (const issue of issues) {
    const path = issue.path.map(String).join('.');
    if (path && fieldNames.has(path)) {
      fields[path] ??= issue.message;
    } else {
      loose.push(path ? `${path}: ${issue.message}` : issue.message);
    }
  }
  return { fields, form: loose.length ? loose.join(' ') : null };
}

/**
 * Turns a failed submission into form errors: a 422's details land on the fields named by their
 * path, anything else (and details naming no field here) goes to the form's error area.
 */
export function serverErrorToFormErrors(error: unknown, fieldNames: ReadonlySet<string>): FormErrors {
  if (!isApiError(error)) {
    return { fields: {}, form: 'Something went wrong. Try again in a moment.' };
  }
  if (error.status === 422 && error.details.length > 0) {
    const fields: Record<string, string> = {};
    const loose: string[] = [];
    for (const detail of error.details) {
      if (detail.path && fieldNames.has(detail.path)) {
        fields[detail.path] ??= detail.message;
      } else {
        loose.push(detail.path ? `${detail.path}: ${detail.message}` : detail.message);
      }
    }
    const form = loose.length ? loose.join(' ') : Object.keys(fields).length ? null : error.message;
    return { fields, form: form ?? (Object.keys(fields).length ? 'Check the fields marked below.' : error.message) };
  }
  return { fields: {}, form: error.message };
}

/** Plain words for the checks a schema leaves to zod's defaults. */
export const friendlyIssueMessage = (issue: z.core.$ZodRawIssue): string | undefined => {
  if (issue.code === 'invalid_type' && (issue.input === undefined || issue.input === '')) return 'This field is required';
  if (issue.code === 'invalid_value') return 'Choose one of the options';
  return undefined;
};
