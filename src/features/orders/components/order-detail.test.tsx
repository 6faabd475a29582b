import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import type { OrderDetail as OrderDetailData } from '../../../../shared/schemas/order.schema';
import { fixtureLine, orderFixture } from '../../../test-utils/order-fixture';
import { renderWithProviders, stubFetch } from '../../../test-utils/render-with-providers';
import { OrderDetail } from './order-detail';

/** An invented confirmed order of Brackenfold Roofworks with 4 tile packs back-ordered. */
function contractorOrder(overrides: Partial<OrderDetailData> = {}): OrderDetailData {
  return orderFixture({
    status: 'confirmed',
    status_label: 'Confirmed',
    revision: 2,
    subtotal: 30_720 * 10,
    line_count: 1,
    updated_at: '2027-02-21 09:00:00',
    lines: [{ ...fixtureLine(101, 11, 'TRS-FL420-SG', 'Interlocking tile, slate grey', 10), confirmed_quantity: 6, back_order_quantity: 4, reserved_quantity: 6, status: 'part_agreed' }],
    allowed_actions: [],
    confirmed_at: '2027-02-21 09:00:00',
    back_ordered_packs: 4,
    ...overrides,
  });
}

const linked = () => screen.queryByRole('list', { name: 'Back-ordered packs' });

describe('OrderDetail (contractor) and back-ordered packs', () => {
  it('says the back-ordered packs will follow as a separate order while none is started', () => {
    stubFetch({});
    renderWithProviders(<OrderDetail order={contractorOrder()} />);
    expect(linked()?.textContent).toContain('4 back-ordered packs follow as a separate order once the merchant has the stock');
    expect(within(linked()!).queryByRole('link')).toBeNull();
  });

  it('links to the order carrying the packs once the merchant has started it, and drops the promise', () => {
    stubFetch({});
    renderWithProviders(<OrderDetail order={contractorOrder({ followed_by: { id: 7, reference: 'RL-000007', status: 'agreed', status_label: 'Changes agreed, waiting for confirmation' } })} />);
    expect(linked()?.textContent).toContain('The back-ordered packs follow as RL-000007 (Changes agreed, waiting for confirmation)');
    expect(within(linked()!).getByRole('link', { name: 'RL-000007' }).getAttribute('href')).toBe('/orders/7');
    expect(linked()?.textContent).not.toContain('separate order');
  });

  it('links a follow-up order to the order whose packs it carries', () => {
    stubFetch({});
    renderWithProviders(<OrderDetail order={contractorOrder({ id: 7, reference: 'RL-000007', back_ordered_packs: 0, follows: { id: 1, reference: 'RL-000001', status: 'delivered', status_label: 'Delivered' } })} />);
    expect(linked()?.textContent).toContain('Carries the back-ordered packs of RL-000001 (Delivered)');
    expect(screen.getByRole('link', { name: 'RL-000001' }).getAttribute('href')).toBe('/orders/1');
  });

  it('promises nothing on an order with nothing back-ordered, or one turned down', () => {
    stubFetch({});
    const { unmount } = renderWithProviders(<OrderDetail order={contractorOrder({ back_ordered_packs: 0 })} />);
    expect(linked()).toBeNull();
    unmount();
    renderWithProviders(<OrderDetail order={contractorOrder({ status: 'turned_down', status_label: 'Turned down by the merchant' })} />);
    expect(linked()).toBeNull();
  });
});

describe('OrderDetail (contractor) and a substitute tile offered by the desk', () => {
  it('shows the engine’s bill side by side, with the price difference, before the contractor accepts', async () => {
    stubFetch({});
    const figures = {
      engine_version: '1.4.0',
      tile: { sku: 'TRS-KP265-BR', description: 'Clay plain tile', kind: 'double_lap', lowest_pitch_deg: 35 },
      refused_faces: [],
      rows: [
        {
          role: 'tile',
          label: 'Tiles',
          changes: true,
          before: { product_id: 11, sku: 'TRS-FL420-SG', description: 'Interlocking tile, slate grey', quantity: 800, unit: 'tile', packs: 800, unit_price: 128, total: 102_400 },
          after: { product_id: 16, sku: 'TRS-KP265-BR', description: 'Clay plain tile', quantity: 5_120, unit: 'tile', packs: 5_120, unit_price: 74, total: 378_880 },
        },
        {
          role: 'batten',
          label: 'Battens',
          changes: true,
          before: { product_id: 14, sku: 'TRS-BAT-3825', description: 'Batten', quantity: 50, unit: 'length', packs: 50, unit_price: 440, total: 22_000 },
          after: { product_id: 14, sku: 'TRS-BAT-3825', description: 'Batten', quantity: 170, unit: 'length', packs: 170, unit_price: 440, total: 74_800 },
        },
      ],
      not_counted: [],
      before_total: 124_400,
      after_total: 453_680,
      price_difference_minor: 329_280,
    };
    const proposal = {
      id: 3,
      status: 'open' as const,
      order_revision: 1,
      message: 'Slate grey is out; plain tiles suit your roof.',
      proposed_date: null,
      proposed_time_window: null,
      proposed_slot_id: null,
      proposed_at: '2027-02-21 09:00:00',
      proposed_by: { id: 2, name: 'Nia Corrow' },
      answered_at: null,
      answered_by: null,
      lines: [
        {
          order_line_id: 101,
          sku: 'TRS-FL420-SG',
          description: 'Interlocking tile, slate grey',
          quantity: 10,
          confirmed_quantity: 0,
          back_order_quantity: 0,
          substitute: { product_id: 16, sku: 'TRS-KP265-BR', description: 'Clay plain tile', unit: 'tile', pack_size: 1, quantity: 5_120, unit_price: 74, total: 378_880, figures },
          note: '',
        },
      ],
    };
    renderWithProviders(<OrderDetail order={contractorOrder({ status: 'changes_offered', status_label: 'Changes offered', proposals: [proposal], allowed_actions: ['accept_changes', 'decline_changes'] })} />);
    const table = screen.getByRole('table', { name: 'TRS-FL420-SG and TRS-KP265-BR side by side' });
    expect(within(table).getByText('Battens')).toBeTruthy();
    expect(within(table).getByText(/5,120 tile · 5,120 packs · £3,788.80/)).toBeTruthy();
    expect(within(table).getByTestId('price-difference').textContent).toBe('(+£3,292.80)');
    expect(await screen.findByRole('button', { name: 'Accept the changes' })).toBeTruthy();
  });
});

describe('OrderDetail (contractor) forms', () => {
  const openProposal = {
    id: 3,
    status: 'open' as const,
    order_revision: 1,
    message: 'Two packs short this week.',
    proposed_date: null,
    proposed_time_window: null,
    proposed_slot_id: null,
    proposed_at: '2027-02-21 09:00:00',
    proposed_by: { id: 2, name: 'Nia Corrow' },
    answered_at: null,
    answered_by: null,
    lines: [],
  };
  const invalid = (path: string, message: string) => ({ status: 422, body: { error: { code: 'validation_failed', message: 'Some fields are not valid', details: [{ path, message }] } } });
  const posted = (fetchMock: ReturnType<typeof stubFetch>, path: string) =>
    fetchMock.mock.calls.filter(([url, init]) => String(url) === path && init?.method === 'POST').map(([, init]) => JSON.parse(String(init!.body)) as unknown);

  it('declines the offered changes with the note, and puts a 422 about the note on the note box, linked by aria-describedby', async () => {
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, 'POST /api/orders/1/proposals/3/decline': invalid('note', 'must be at most 500 characters') });
    const order = contractorOrder({ status: 'changes_offered', status_label: 'Changes offered', proposals: [openProposal], allowed_actions: ['accept_changes', 'decline_changes'] });
    renderWithProviders(<OrderDetail order={order} />);
    const note = await screen.findByLabelText('A note with your answer (optional)');
    fireEvent.change(note, { target: { value: '  Please send the rest next week ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Decline' }));
    await waitFor(() => expect(note.getAttribute('aria-invalid')).toBe('true'));
    expect(posted(fetchMock, `/api/orders/${order.id}/proposals/3/decline`)).toEqual([{ note: 'Please send the rest next week' }]);
    expect(document.getElementById(note.getAttribute('aria-describedby')!)?.textContent).toContain('must be at most 500 characters');
  });

  it('asks before cancelling, with the reason box focused, and puts a 422 about the reason on that box', async () => {
    const order = contractorOrder({ status: 'sent', status_label: 'Sent', allowed_actions: ['cancel'] });
    const fetchMock = stubFetch({ 'GET /api/auth/csrf': { status: 200, body: { token: 't' } }, [`POST /api/orders/${order.id}/cancel`]: invalid('reason', 'must not hold a control character') });
    renderWithProviders(<OrderDetail order={order} />);
    fireEvent.click(screen.getByRole('button', { name: 'Cancel the order' }));
    const form = await screen.findByRole('form', { name: 'Cancel the order?' });
    const reason = within(form).getByLabelText('Why (the merchant sees this; optional)');
    await waitFor(() => expect(document.activeElement).toBe(reason));
    fireEvent.change(reason, { target: { value: 'Site postponed' } });
    fireEvent.click(within(form).getByRole('button', { name: `Yes, cancel ${order.reference}` }));
    await waitFor(() => expect(reason.getAttribute('aria-invalid')).toBe('true'));
    expect(posted(fetchMock, `/api/orders/${order.id}/cancel`)).toEqual([{ reason: 'Site postponed' }]);
    expect(document.getElementById(reason.getAttribute('aria-describedby')!)?.textContent).toContain('must not hold a control character');
  });
});
