import { fireEvent, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../test-utils/render-with-providers';
import { ProjectsList } from './projects-list';

const site = {
  id: 8,
  name: 'Hollin Brow',
  reference: 'HB',
  site_address: 'Hollin Brow, Tollerbeck',
  site_postcode: 'TB1 4QX',
  contact_name: 'Rhian Fenwick',
  contact_phone: '07700 900 118',
  building_count: 3,
  schedule: null,
  estimate_count: 0,
  archived_at: null,
  created_at: '2027-02-01 09:00:00',
  updated_at: '2027-02-01 09:00:00',
};

/** Answers GET /api/projects with one site whatever is asked, recording each query. */
function stubProjects(): URLSearchParams[] {
  const queries: URLSearchParams[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL) => {
      const url = new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost');
      queries.push(url.searchParams);
      return new Response(JSON.stringify({ projects: [site], total: 1, page: 1, page_size: 50 }), { status: 200, headers: { 'Content-Type': 'application/json' } });
    }),
  );
  return queries;
}

describe('ProjectsList search', () => {
  it('asks for the words as they are typed, trimmed, and for archived sites too once the box is ticked', async () => {
    const queries = stubProjects();
    renderWithProviders(<ProjectsList />, { path: '/sites' });
    await screen.findByRole('table', { name: 'Sites' });
    fireEvent.change(await screen.findByLabelText('Search sites'), { target: { value: '  Hollin ' } });
    await waitFor(() => expect(queries.at(-1)?.get('q')).toBe('Hollin'));
    expect(queries.at(-1)?.get('archived')).toBe('false');
    fireEvent.click(await screen.findByRole('checkbox', { name: 'Include archived sites' }));
    await waitFor(() => expect(queries.at(-1)?.get('archived')).toBe('all'));
    expect(queries.at(-1)?.get('q')).toBe('Hollin');
  });

  it('says on the box, linked by aria-describedby, that the words are too long, and asks for none of them', async () => {
    const queries = stubProjects();
    renderWithProviders(<ProjectsList />, { path: '/sites' });
    await screen.findByRole('table', { name: 'Sites' });
    const box = await screen.findByLabelText('Search sites');
    fireEvent.change(box, { target: { value: 'H'.repeat(101) } });
    await waitFor(() => expect(box.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(box.getAttribute('aria-describedby')!)?.textContent).toContain('at most 100 characters');
    expect(queries.every((q) => !q.has('q'))).toBe(true);
  });
});
