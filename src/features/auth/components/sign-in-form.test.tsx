import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { SignInForm } from './sign-in-form';

function fill(label: string, value: string) {
  fireEvent.input(screen.getByLabelText(label), { target: { value } });
}

function submit() {
  fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
}

const session = {
  user: { id: 4, email: 'ada@ridge-roofing.test', name: 'Ada Penhallow', role: 'contractor_owner' },
  organisation: { id: 2, name: 'Penhallow Roofing', kind: 'contractor' },
  calendar: { time_zone: 'Europe/London', today: '2026-12-07' },
  currency: 'GBP',
};

describe('SignInForm', () => {
  it('shows the schema’s messages beside the fields and sends nothing when both are empty', async () => {
    const fetchMock = stubFetch({});
    renderWithProviders(<SignInForm onSignedIn={vi.fn()} />);

    submit();

    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    const email = screen.getByLabelText('E-mail');
    expect(email.getAttribute('aria-invalid')).toBe('true');
    expect(email.getAttribute('aria-describedby')).toContain(screen.getByText('Enter a valid e-mail address').id);
    expect(document.activeElement).toBe(email);
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('shows the server’s message in the form error area when the password is wrong', async () => {
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf-1' } },
      'POST /api/auth/login': { status: 401, body: { error: { code: 'invalid_credentials', message: 'E-mail or password is wrong' } } },
    });
    const onSignedIn = vi.fn();
    renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);

    fill('E-mail', 'ada@ridge-roofing.test');
    fill('Password', 'not-the-password');
    submit();

    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('E-mail or password is wrong');
    expect(onSignedIn).not.toHaveBeenCalled();
  });

  it('puts a 422 detail on the field its path names', async () => {
    stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf-1' } },
      'POST /api/auth/login': {
        status: 422,
        body: { error: { code: 'validation_failed', message: 'Check the form', details: [{ path: 'email', message: 'Unknown domain' }] } },
      },
    });
    renderWithProviders(<SignInForm onSignedIn={vi.fn()} />);

    fill('E-mail', 'ada@ridge-roofing.test');
    fill('Password', 'whatever-it-is');
    submit();

    expect(await screen.findByText('Unknown domain')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
  });

  it('signs in with the trimmed, lower-case address and hands over the session', async () => {
    const fetchMock = stubFetch({
      'GET /api/auth/csrf': { status: 200, body: { token: 'csrf-1' } },
      'POST /api/auth/login': { status: 200, body: session },
    });
    const onSignedIn = vi.fn();
    renderWithProviders(<SignInForm onSignedIn={onSignedIn} />);

    fill('E-mail', '  Ada@Ridge-Roofing.test ');
    fill('Password', 'ridgeload-demo');
    submit();

    await waitFor(() => expect(onSignedIn).toHaveBeenCalledWith(session));
    const login = fetchMock.mock.calls.find((call) => call[0] === '/api/auth/login');
    expect(JSON.parse((login![1] as RequestInit).body as string)).toEqual({ email: 'ada@ridge-roofing.test', password: 'ridgeload-demo' });
  });
});
