import { fireEvent, render, screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { QuoteRequestSearch } from './quote-request-search';

describe('QuoteRequestSearch', () => {
  it('refuses search words over 100 characters on the box, linked by aria-describedby, and searches for nothing', async () => {
    const onSearch = vi.fn();
    render(<QuoteRequestSearch status={undefined} q={undefined} placeholder="12 or Q-12" onSearch={onSearch} />);
    const box = screen.getByRole('searchbox', { name: 'Search quote requests' });
    fireEvent.change(box, { target: { value: 'Q'.repeat(101) } });
    fireEvent.submit(screen.getByRole('search'));
    await waitFor(() => expect(box.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(box.getAttribute('aria-describedby')!)?.textContent).toContain('at most 100 characters');
    expect(onSearch).not.toHaveBeenCalled();
  });

  it('reads the choices and words into the list filters: an empty stage is every stage, the tick box is "true"', async () => {
    const onSearch = vi.fn();
    render(<QuoteRequestSearch status="open" q={undefined} waiting={false} placeholder="12 or Q-12" onSearch={onSearch} />);
    fireEvent.change(screen.getByRole('searchbox', { name: 'Search quote requests' }), { target: { value: '  Hollin ' } });
    fireEvent.change(screen.getByRole('combobox', { name: 'Stage' }), { target: { value: '' } });
    await waitFor(() => expect(onSearch).toHaveBeenCalledTimes(1));
    expect(onSearch.mock.calls[0][0]).toEqual({ status: undefined, waiting: undefined, q: 'Hollin' });
    fireEvent.click(screen.getByRole('checkbox', { name: 'Only those waiting for our price' }));
    await waitFor(() => expect(onSearch).toHaveBeenCalledTimes(2));
    expect(onSearch.mock.calls[1][0]).toEqual({ status: undefined, waiting: 'true', q: 'Hollin' });
  });

  it('offers the waiting box only to the list that passes it', () => {
    render(<QuoteRequestSearch status={undefined} q={undefined} placeholder="12 or Q-12" onSearch={vi.fn()} />);
    expect(screen.queryByRole('checkbox')).toBeNull();
  });

  it('follows the address when it changes from outside (Back, Forward, clearing), keeping words typed but not searched for in a field the address left alone', async () => {
    const props = { placeholder: '12 or Q-12', onSearch: vi.fn() };
    const { rerender } = render(<QuoteRequestSearch status="open" q="Hollin" waiting={false} {...props} />);
    const box = screen.getByRole('searchbox', { name: 'Search quote requests' }) as HTMLInputElement;
    const stage = screen.getByRole('combobox', { name: 'Stage' }) as HTMLSelectElement;
    expect([stage.value, box.value]).toEqual(['open', 'Hollin']);

    rerender(<QuoteRequestSearch status="accepted" q="Quarry" waiting={true} {...props} />);
    await waitFor(() => expect([stage.value, box.value]).toEqual(['accepted', 'Quarry']));
    expect((screen.getByRole('checkbox', { name: 'Only those waiting for our price' }) as HTMLInputElement).checked).toBe(true);

    fireEvent.change(box, { target: { value: 'Birch' } });
    rerender(<QuoteRequestSearch status={undefined} q="Quarry" waiting={false} {...props} />);
    await waitFor(() => expect(stage.value).toBe(''));
    expect(box.value).toBe('Birch');
  });
});
