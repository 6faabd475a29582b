import { describe, expect, it } from 'vitest';
import { pageApi } from '../setup/e2e-pages';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

interface Book {
  orders: { id: number; reference: string; status: string; po_reference: string }[];
}
interface Detail {
  id: number;
  reference: string;
  status: string;
  back_ordered_packs: number;
  follows: { id: number; reference: string } | null;
  followed_by: { id: number; reference: string } | null;
  lines: { sku: string; quantity: number; back_order_quantity: number; unit_price: number }[];
}

describe('the desk sends the back-ordered packs on later', () => {
  it('starts the follow-up order from the part-confirmed demo order, lands on it, and the contractor sees both ends', { timeout: 180_000 }, async () => {
    const desk = await (await journey.browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    await journey.signIn(desk, 'sales@demo.test', /\/desk$/);
    // The demo book holds one confirmed order with part of its hip tiles back-ordered (PO HB-P05).
    const book = await pageApi<Book>(desk, 'GET', '/api/orders?statuses=confirmed&sort=placed_at&dir=desc&page_size=50');
    const first = book.orders.find((o) => o.po_reference === 'HB-P05');
    expect(first).toBeDefined();
    const before = await pageApi<Detail>(desk, 'GET', `/api/orders/${first!.id}`);
    const owed = before.lines.filter((l) => l.back_order_quantity > 0);
    expect(owed.length).toBeGreaterThan(0);

    await desk.goto(`${journey.server.url}/desk/orders/${first!.id}`);
    await desk.getByRole('heading', { name: 'Back-ordered packs' }).waitFor();
    await expectAccessible(desk);
    await desk.getByRole('button', { name: 'Start the follow-up order' }).click();
    await desk.waitForURL((url) => /\/desk\/orders\/\d+$/.test(url.pathname) && !url.pathname.endsWith(`/${first!.id}`));
    await desk.getByRole('list', { name: 'Linked orders' }).getByText(`Carries the back-ordered packs of ${first!.reference}`).waitFor();
    await expectAccessible(desk);

    const followId = Number(new URL(desk.url()).pathname.split('/').pop());
    const follow = await pageApi<Detail>(desk, 'GET', `/api/orders/${followId}`);
    expect(follow.status).toBe('agreed');
    expect(follow.follows?.id).toBe(first!.id);
    expect(follow.lines.map((l) => [l.sku, l.quantity, l.unit_price])).toEqual(owed.map((l) => [l.sku, l.back_order_quantity, l.unit_price]));

    // The first order now points at it and offers no second follow-up.
    await desk.goto(`${journey.server.url}/desk/orders/${first!.id}`);
    await desk.getByRole('list', { name: 'Linked orders' }).getByText(`The back-ordered packs follow as ${follow.reference}`).waitFor();
    expect(await desk.getByRole('button', { name: 'Start the follow-up order' }).count()).toBe(0);

    const estimator = await (await journey.browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    await journey.signIn(estimator, 'estimator@demo.test', /\/contractor$/);
    await estimator.goto(`${journey.server.url}/orders/${followId}`);
    await estimator.getByRole('list', { name: 'Back-ordered packs' }).getByText(`Carries the back-ordered packs of ${first!.reference}`).waitFor();
    await expectAccessible(estimator);
  });
});
