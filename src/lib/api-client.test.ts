import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { stubFetch } from '../test-utils/render-with-providers';
import { ApiError, createApiClient, signInPathWithNext } from './api-client';

function headersOf(call: unknown[]): Record<string, string> {
  const init = call[1] as RequestInit | undefined;
  return (init?.headers ?? {}) as Record<string, string>;
}

describe('api client', () => {
  it('fetches a CSRF token once and sends it as X-CSRF-Token on state-changing requests', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'token-one' } },
      'POST /api/invitations': { status: 201, body: { id: 7 } },
      'DELETE /api/invitations/7': { status: 204 },
    });
    const client = createApiClient();

    const created = await client.post('/api/invitations', {
      body: { email: 'bea@roofs.test', role: 'contractor_estimator' },
      schema: z.object({ id: z.number() }),
    });
    await client.delete('/api/invitations/7');

    expect(created).toEqual({ id: 7 });
    const calls = fetchMock.mock.calls.map((call) => `${(call[1] as RequestInit).method} ${call[0] as string}`);
    expect(calls).toEqual(['GET /api/auth/csrf', 'POST /api/invitations', 'DELETE /api/invitations/7']);
    expect(headersOf(fetchMock.mock.calls[1])['X-CSRF-Token']).toBe('token-one');
    expect(headersOf(fetchMock.mock.calls[2])['X-CSRF-Token']).toBe('token-one');
    expect((fetchMock.mock.calls[1][1] as RequestInit).credentials).toBe('same-origin');
    expect((fetchMock.mock.calls[1][1] as RequestInit).body).toBe('{"email":"bea@roofs.test","role":"contractor_estimator"}');
  });

  it('sends no CSRF token on a GET', async () => {
    const fetchMock = stubFetch({ 'GET /api/health': { status: 200, body: { ok: true } } });
    await createApiClient().get('/api/health');
    expect(fetchMock).toHaveBeenCalledTimes(1);
    expect(headersOf(fetchMock.mock.calls[0])['X-CSRF-Token']).toBeUndefined();
  });

  it('refetches the token and retries once when the server answers 403 csrf_invalid', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': [
        { status: 200, body: { token: 'stale' } },
        { status: 200, body: { token: 'fresh' } },
      ],
      'PATCH /api/members/3': [
        { status: 403, body: { error: { code: 'csrf_invalid', message: 'The form expired' } } },
        { status: 200, body: { ok: true } },
      ],
    });

    const result = await createApiClient().patch('/api/members/3', { body: { role: 'driver' }, schema: z.object({ ok: z.boolean() }) });

    expect(result).toEqual({ ok: true });
    const patchCalls = fetchMock.mock.calls.filter((call) => (call[1] as RequestInit).method === 'PATCH');
    expect(patchCalls.map((call) => headersOf(call)['X-CSRF-Token'])).toEqual(['stale', 'fresh']);
  });

  it('gives up after one retry and reports the second csrf_invalid', async () => {
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'never-good' } },
      'POST /api/auth/logout': { status: 403, body: { error: { code: 'csrf_invalid', message: 'The form expired' } } },
    });
    const attempt = createApiClient().post('/api/auth/logout');
    await expect(attempt).rejects.toMatchObject({ status: 403, code: 'csrf_invalid' });
  });

  it('does not retry a 403 for a role that is not allowed', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'DELETE /api/members/9': { status: 403, body: { error: { code: 'forbidden', message: 'Your role may not do that' } } },
    });
    await expect(createApiClient().delete('/api/members/9')).rejects.toMatchObject({ status: 403, code: 'forbidden' });
    expect(fetchMock.mock.calls.filter((call) => (call[1] as RequestInit).method === 'DELETE')).toHaveLength(1);
  });

  it('parses the shared error body into an ApiError with status, code, message and details', async () => {
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/invitations': {
        status: 422,
        body: {
          error: {
            code: 'validation_failed',
            message: 'Some fields need attention',
            details: [{ path: 'email', message: 'Enter a valid e-mail address' }],
          },
        },
      },
    });

    const error = await createApiClient()
      .post('/api/invitations', { body: { email: 'nope' } })
      .catch((caught: unknown) => caught);

    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 422,
      code: 'validation_failed',
      message: 'Some fields need attention',
      details: [{ path: 'email', message: 'Enter a valid e-mail address' }],
    });
  });

  it('turns a body that is not the error schema into a generic ApiError naming the status', async () => {
    stubFetch({ 'GET /api/organisation': { status: 502, body: '<html>Bad gateway</html>' } });
    const error = await createApiClient()
      .get('/api/organisation')
      .catch((caught: unknown) => caught);
    expect(error).toMatchObject({ status: 502, code: 'http_error' });
    expect((error as ApiError).message).toContain('502');
  });

  it('reports a network failure as an ApiError with status 0', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))),
    );
    await expect(createApiClient().get('/api/members')).rejects.toMatchObject({ status: 0, code: 'network_error' });
  });

  it('rejects a success body that does not match the response schema', async () => {
    stubFetch({ 'GET /api/members': { status: 200, body: { members: 'everyone' } } });
    const schema = z.object({ members: z.array(z.object({ id: z.number() })) });
    await expect(createApiClient().get('/api/members', { schema })).rejects.toMatchObject({ code: 'invalid_response' });
  });

  it('sends the person to sign in with ?next= on a 401', async () => {
    window.history.replaceState(null, '', '/team?tab=invitations');
    stubFetch({ 'GET /api/members': { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in first' } } } });
    const onUnauthenticated = vi.fn();

    await expect(createApiClient({ onUnauthenticated }).get('/api/members')).rejects.toMatchObject({ status: 401 });

    expect(onUnauthenticated).toHaveBeenCalledWith('/team?tab=invitations');
    expect(signInPathWithNext('/team?tab=invitations')).toBe('/sign-in?next=%2Fteam%3Ftab%3Dinvitations');
  });

  it('does not redirect on a 401 the caller expects (wrong password)', async () => {
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 't' } },
      'POST /api/auth/login': { status: 401, body: { error: { code: 'invalid_credentials', message: 'E-mail or password is wrong' } } },
    });
    const onUnauthenticated = vi.fn();
    const attempt = createApiClient({ onUnauthenticated }).post('/api/auth/login', {
      body: { email: 'a@b.test', password: 'x' },
      redirectOnUnauthenticated: false,
    });
    await expect(attempt).rejects.toMatchObject({ code: 'invalid_credentials', message: 'E-mail or password is wrong' });
    expect(onUnauthenticated).not.toHaveBeenCalled();
  });

  it('fetches a new CSRF token after a call that gives the session a new id', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': [
        { status: 200, body: { token: 'before' } },
        { status: 200, body: { token: 'after' } },
      ],
      'POST /api/auth/login': { status: 200, body: {} },
      'POST /api/invitations': { status: 201, body: {} },
    });
    const client = createApiClient();
    await client.post('/api/auth/login', { body: {}, rotatesSession: true });
    await client.post('/api/invitations', { body: {} });
    const invitationCall = fetchMock.mock.calls.find((call) => call[0] === '/api/invitations');
    expect(headersOf(invitationCall!)['X-CSRF-Token']).toBe('after');
  });

  it('builds a plain sign-in path when there is nowhere useful to return to', () => {
    expect(signInPathWithNext('/')).toBe('/sign-in');
    expect(signInPathWithNext('/sign-in?next=%2Fteam')).toBe('/sign-in');
  });
});
