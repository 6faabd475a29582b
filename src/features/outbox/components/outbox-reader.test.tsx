import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { OutboxReader } from './outbox-reader';

const message = {
  id: 3,
  from: 'Ridgeload <no-reply@ridgeload.test>',
  to: 'ana@kestle-roofing.test',
  subject: 'Reset your Ridgeload password',
  text: 'Open this link to choose a new password.',
  html: '<p>Open <a href="/reset-password?token=x">this link</a>.</p><script>parent.alert(1)</script>',
  created_at: '2026-12-01 08:00:00',
};

describe('OutboxReader', () => {
  it('shows a message’s text and its HTML in an iframe sandboxed without scripts', async () => {
    stubFetch({ 'GET /api/dev/outbox': { status: 200, body: { messages: [message] } } });
    renderWithProviders(<OutboxReader selectedId={3} hrefFor={(id) => `/outbox/${id}`} listHref="/outbox" />);
    expect(await screen.findByRole('heading', { level: 2, name: 'Reset your Ridgeload password' })).toBeTruthy();
    expect(screen.getByText('Open this link to choose a new password.')).toBeTruthy();
    const frame = screen.getByTitle('HTML part of “Reset your Ridgeload password”');
    expect(frame.getAttribute('sandbox')).toBe('');
    expect(frame.getAttribute('srcdoc')).toBe(message.html);
  });

  it('explains calmly when the server has no outbox (production answers 404)', async () => {
    stubFetch({ 'GET /api/dev/outbox': { status: 404, body: { error: { code: 'not_found', message: 'No such API route' } } } });
    renderWithProviders(<OutboxReader selectedId={null} hrefFor={(id) => `/outbox/${id}`} listHref="/outbox" />);
    expect(await screen.findByText('No outbox on this server')).toBeTruthy();
    expect(screen.getByText(/No such API route/)).toBeTruthy();
  });

  it('says so when nothing has been sent yet', async () => {
    stubFetch({ 'GET /api/dev/outbox': { status: 200, body: { messages: [] } } });
    renderWithProviders(<OutboxReader selectedId={null} hrefFor={(id) => `/outbox/${id}`} listHref="/outbox" />);
    expect(await screen.findByText('No e-mail sent yet')).toBeTruthy();
  });
});
