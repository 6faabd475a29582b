import { describe, expect, it } from 'vitest';
import { signupBodySchema } from '../../../shared/schemas/auth.schema';
import { ApiError } from '../../lib/api-client';
import { friendlyIssueMessage, issuesToFormErrors, serverErrorToFormErrors } from './form-errors';

const fields = new Set(['organisation_name', 'kind', 'name', 'email', 'password']);

describe('form errors', () => {
  it('puts each schema problem on the field its path names, first message only', () => {
    const parsed = signupBodySchema.safeParse(
      { organisation_name: '', name: 'Jo', email: 'jo@', password: 'short' },
      { error: friendlyIssueMessage },
    );
    expect(parsed.success).toBe(false);
    const errors = issuesToFormErrors(parsed.error!.issues, fields);
    expect(errors.fields).toEqual({
      organisation_name: 'Enter the firm’s name',
      kind: 'Choose one of the options',
      email: 'Enter a valid e-mail address',
      password: 'Use at least 10 characters',
    });
    expect(errors.form).toBeNull();
  });

  it('maps 422 details onto fields by path and keeps the rest for the form area', () => {
    const error = new ApiError(422, 'validation_failed', 'Check the form', [
      { path: 'email', message: 'Already invited' },
      { path: 'branch_id', message: 'Unknown branch' },
    ]);
    expect(serverErrorToFormErrors(error, fields)).toEqual({
      fields: { email: 'Already invited' },
      form: 'branch_id: Unknown branch',
    });
  });

  it('shows any other API error in the form area with the server’s words', () => {
    const error = new ApiError(409, 'signup_failed', 'That account could not be created');
    expect(serverErrorToFormErrors(error, fields)).toEqual({ fields: {}, form: 'That account could not be created' });
  });

  it('says something plain for an error that is not from the API', () => {
    expect(serverErrorToFormErrors(new Error('boom'), fields).form).toMatch(/Something went wrong/);
  });
});
