import { ApiError, isApiError } from '../../../lib/api-client';

/**
 * A typed number ("4.6", "1 200", "1,200" read as 1200); blank is undefined, and anything else is
 * left as text so the shared schema names the field ("must be a number").
 */
export function numberOrText(text: unknown): number | string | undefined {
  if (typeof text !== 'string') return undefined;
  const t = text
    .trim()
    .replace(/\s/g, '')
    .replace(/,(?=\d{3}(?!\d))/g, '');
  if (t === '') return undefined;
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : text.trim();
}

/** A typed text, or undefined when the field is not on the form. */
export function textOf(text: unknown): string | undefined {
  return typeof text === 'string' ? text : undefined;
}

/**
 * A 409 whose details name fields (a taken SKU, a count below what is reserved) is shown at those
 * fields like a 422: the shared form only places 422 details, and these are just as much about one field.
 */
export function withFieldDetails(error: unknown): unknown {
  if (isApiError(error) && error.status === 409 && error.details.some((d) => d.path)) {
    return new ApiError(422, error.code, error.message, error.details);
  }
  return error;
}

/** A form's submit whose 409 naming fields is shown at those fields (see `withFieldDetails`). */
export function showingFieldDetails<A extends unknown[]>(submit: (...args: A) => Promise<void>): (...args: A) => Promise<void> {
  return async (...args) => {
    try {
      await submit(...args);
    } catch (error) {
      throw withFieldDetails(error);
    }
  };
}
