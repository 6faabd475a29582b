import type { z } from 'zod';
import { safeParse } from 'zod/mini';
import { errorBodySchema } from '../../shared/schemas/error.schema';
import type { ErrorDetail } from '../../shared/schemas/error.schema';
import { csrfBodySchema } from '../../shared/schemas/auth.schema';

/** An error from the API (or from reaching it), carrying the shared error body's fields. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: ErrorDetail[];

  constructor(status: number, code: string, message: string, details: ErrorDetail[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface RequestOptions<TSchema extends z.core.$ZodType | undefined> {
  /** Sent as JSON, or as multipart when it is a FormData (file uploads). */
  body?: unknown;
  /** Parses the response body; without it the body is ignored (e.g. 204). */
  schema?: TSchema;
  signal?: AbortSignal;
  /**
   * Whether a 401 sends the person to the sign-in page. Off for the calls where a 401 is an
   * expected answer (who am I, sign in, public token pages).
   */
  redirectOnUnauthenticated?: boolean;
  /** The server gives the session a new id after this call, so the CSRF token must be fetched again. */
  rotatesSession?: boolean;
  /** Extra request headers, e.g. the Idempotency-Key that makes a retried write land once. */
  headers?: Record<string, string>;
}

type Result<TSchema> = TSchema extends z.core.$ZodType ? z.output<TSchema> : undefined;

export interface ApiClientOptions {
  /** Called with the path to come back to after signing in. */
  onUnauthenticated?: (nextPath: string) => void;
}

const STATE_CHANGING: ReadonlySet<Method> = new Set(['POST', 'PATCH', 'PUT', 'DELETE']);
export const SIGN_IN_PATH = '/sign-in';

/** The sign-in address that brings the person back to `nextPath` afterwards. */
export function signInPathWithNext(nextPath: string): string {
  if (!nextPath || nextPath === '/' || nextPath.startsWith(SIGN_IN_PATH)) return SIGN_IN_PATH;
  return `${SIGN_IN_PATH}?next=${encodeURIComponent(nextPath)}`;
}

function currentPath(): string {
  return `${window.location.pathname}${window.location.search}`;
}

function defaultUnauthenticated(nextPath: string): void {
  if (window.location.pathname.startsWith(SIGN_IN_PATH)) return;
  window.location.assign(signInPathWithNext(nextPath));
}

async function readJson(response: Response): Promise<unknown> {
  const text = await response.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

function toApiError(status: number, body: unknown): ApiError {
  const parsed = safeParse(errorBodySchema, body);
  if (parsed.success) {
    const { code, message, details } = parsed.data.error;
    return new ApiError(status, code, message, details ?? []);
  }
  return new ApiError(status, 'http_error', `The server answered with status ${status}. Try again in a moment.`);
}

/**
 * The one fetch client of the app: JSON in and out, same-origin cookies, the CSRF header on
 * state-changing requests (with one fresh-token retry when the server says it is stale),
 * error bodies parsed into ApiError, and a sign-in redirect on 401.
 */
export function createApiClient(options: ApiClientOptions = {}) {
  let onUnauthenticated = options.onUnauthenticated ?? defaultUnauthenticated;
  let csrfToken: string | null = null;
  let csrfPending: Promise<string> | null = null;

  async function send(method: Method, path: string, body: unknown, signal: AbortSignal | undefined, token: string | null, extraHeaders?: Record<string, string>) {
    const headers: Record<string, string> = { ...extraHeaders, Accept: 'application/json' };
    // A FormData body (file uploads) sets its own multipart Content-Type with the boundary.
    const isForm = typeof FormData !== 'undefined' && body instanceof FormData;
    if (body !== undefined && !isForm) headers['Content-Type'] = 'application/json';
    if (token) headers['X-CSRF-Token'] = token;
    try {
      return await fetch(path, {
        method,
        headers,
        body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
        credentials: 'same-origin',
        signal,
      });
    } catch (error) {
      if (signal?.aborted) throw error;
      throw new ApiError(0, 'network_error', 'Ridgeload could not be reached. Check the connection and try again.');
    }
  }

  async function fetchCsrfToken(): Promise<string> {
    const response = await send('GET', '/api/auth/csrf', undefined, undefined, null);
    const body = await readJson(response);
    if (!response.ok) throw toApiError(response.status, body);
    const parsed = safeParse(csrfBodySchema, body);
    if (!parsed.success) throw new ApiError(response.status, 'invalid_response', 'The server sent an unexpected answer.');
    return parsed.data.token;
  }

  function getCsrfToken(): Promise<string> {
    if (csrfToken) return Promise.resolve(csrfToken);
    // Concurrent mutations share one token request.
    csrfPending ??= fetchCsrfToken()
      .then((token) => {
        csrfToken = token;
        return token;
      })
      .finally(() => {
        csrfPending = null;
      });
    return csrfPending;
  }

  function forgetCsrfToken(): void {
    csrfToken = null;
  }

  async function request<TSchema extends z.core.$ZodType | undefined = undefined>(method: Method, path: string, opts: RequestOptions<TSchema> = {}): Promise<Result<TSchema>> {
    const needsToken = STATE_CHANGING.has(method);
    let token = needsToken ? await getCsrfToken() : null;
    let response = await send(method, path, opts.body, opts.signal, token, opts.headers);
    let body = await readJson(response);

    if (needsToken && response.status === 403 && toApiError(403, body).code === 'csrf_invalid') {
      forgetCsrfToken();
      token = await getCsrfToken();
      response = await send(method, path, opts.body, opts.signal, token, opts.headers);
      body = await readJson(response);
    }

    if (!response.ok) {
      const error = toApiError(response.status, body);
      if (response.status === 401 && opts.redirectOnUnauthenticated !== false) {
        forgetCsrfToken();
        onUnauthenticated(currentPath());
      }
      throw error;
    }

    if (opts.rotatesSession) forgetCsrfToken();
    if (!opts.schema) return undefined as Result<TSchema>;
    const parsed = safeParse(opts.schema, body);
    if (!parsed.success) {
      throw new ApiError(response.status, 'invalid_response', 'The server sent an answer Ridgeload could not read.');
    }
    return parsed.data as Result<TSchema>;
  }

  return {
    request,
    get: <S extends z.core.$ZodType | undefined = undefined>(path: string, opts?: RequestOptions<S>) => request('GET', path, opts),
    post: <S extends z.core.$ZodType | undefined = undefined>(path: string, opts?: RequestOptions<S>) => request('POST', path, opts),
    patch: <S extends z.core.$ZodType | undefined = undefined>(path: string, opts?: RequestOptions<S>) => request('PATCH', path, opts),
    put: <S extends z.core.$ZodType | undefined = undefined>(path: string, opts?: RequestOptions<S>) => request('PUT', path, opts),
    delete: <S extends z.core.$ZodType | undefined = undefined>(path: string, opts?: RequestOptions<S>) => request('DELETE', path, opts),
    forgetCsrfToken,
    setOnUnauthenticated(handler: (nextPath: string) => void) {
      onUnauthenticated = handler;
    },
  };
}

export type ApiClient = ReturnType<typeof createApiClient>;

export const apiClient = createApiClient();
