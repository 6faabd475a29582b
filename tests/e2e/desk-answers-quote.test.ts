import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { pageApi } from '../setup/e2e-pages';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

/** A day three weeks ahead as YYYY-MM-DD: always a day the merchants can still be asked for. */
function inThreeWeeks(): string {
  return new Date(Date.now() + 21 * 86_400_000).toISOString().slice(0, 10);
}

const signIn = (page: Page, email: string, home: RegExp) => journey.signIn(page, email, home);

const api = pageApi;

interface EstimateLine {
  category: string;
  product_id: number | null;
  sku: string | null;
  description: string;
  packs: number;
}
interface RequestDetail {
  id: number;
  status: string;
  lines: { id: number; category: string; description: string; quantity: number }[];
  quotes: { id: number; status: string; total: number | null; branch: { id: number; name: string }; lines: { request_line_id: number; sku: string | null; packs: number; unit_price: number; total: number }[] }[];
}

/** The job price the desk gives on the tiles, in pence per tile: below the demo list price of 128 p. */
const TILE_JOB_PRICE = 115;

describe('the demo desk answers a quote request from the demo estimator', () => {
  // A long story with an accessibility check on every page it opens: each check takes seconds on a busy machine.
  it(
    'the estimator asks two merchants to price an estimate, the desk prices each line with its own products and packs, the estimator compares and turns the answer into an order at the quoted prices',
    { timeout: 300_000 },
    async () => {
      const estimatorContext = await journey.browser.newContext({ viewport: { width: 1280, height: 900 } });
      const deskContext = await journey.browser.newContext({ viewport: { width: 1440, height: 900 } });
      const otherDeskContext = await journey.browser.newContext();
      const failures: string[] = [];
      try {
        const estimator = await estimatorContext.newPage();
        estimator.on('pageerror', (error) => failures.push(error.message));
        await signIn(estimator, 'estimator@demo.test', /\/contractor$/);

        // An estimate of the demo site from Tollerbeck Yard's interlocking tile system (the estimator journey covers making one on screen).
        const { projects } = await api<{ projects: { id: number }[] }>(estimator, 'GET', '/api/projects?q=Hollin%20Brow');
        const { branches } = await api<{ branches: { id: number; name: string }[] }>(estimator, 'GET', '/api/merchant-branches');
        const yard = branches.find((b) => b.name === 'Tollerbeck Yard')!;
        const wharf = branches.find((b) => b.name === 'Caddonmere Wharf')!;
        const { systems } = await api<{ systems: { id: number; name: string }[] }>(estimator, 'GET', `/api/systems?branch_id=${yard.id}`);
        const system = systems.find((s) => s.name === 'Flatlock 420 interlocking tile roof')!;
        const estimate = await api<{ id: number; lines: EstimateLine[] }>(estimator, 'POST', `/api/projects/${projects[0].id}/estimates`, { system_id: system.id });
        const skuOf = new Map(estimate.lines.filter((l) => l.sku).map((l) => [l.category, l.sku!]));

        // The estimator asks Tollerbeck Yard (its system's branch, ticked already) and Caddonmere Wharf.
        await estimator.goto(`${journey.server.url}/estimates/${estimate.id}`);
        await estimator.getByRole('link', { name: 'Ask merchants for quotes' }).waitFor();
        await expectAccessible(estimator);
        await estimator.getByRole('link', { name: 'Ask merchants for quotes' }).click();
        await estimator.waitForURL(new RegExp(`/estimates/${estimate.id}/quote$`));
        const askForm = estimator.getByRole('form', { name: 'Ask for quotes' });
        const yardBox = askForm.getByRole('checkbox', { name: /Tollerbeck Yard/ });
        await yardBox.waitFor();
        expect(await yardBox.isChecked()).toBe(true);
        await expectAccessible(estimator);
        await askForm.getByRole('checkbox', { name: /Caddonmere Wharf/ }).check();
        await askForm.getByLabel('Day wanted').fill(inThreeWeeks());
        await askForm.getByLabel('Your PO reference').fill('HB-QUOTE-E2E');
        await askForm.getByRole('button', { name: 'Send the quote request' }).click();
        await estimator.waitForURL(/\/quotes\/\d+$/);
        const requestId = Number(new URL(estimator.url()).pathname.split('/').pop());
        await estimator.getByRole('heading', { level: 1, name: `Quote request ${requestId}` }).waitFor();
        expect(await estimator.getByText('Waiting for a price').count()).toBe(2);
        await expectAccessible(estimator);
        // It is listed with the firm's quote requests, and opens from there.
        await estimator.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Quotes' }).click();
        await estimator.getByRole('link', { name: `Request ${requestId}`, exact: true }).waitFor();
        await expectAccessible(estimator);
        await estimator.getByRole('link', { name: `Request ${requestId}`, exact: true }).click();
        await estimator.waitForURL(new RegExp(`/quotes/${requestId}$`));

        // The desk finds this request among the ones waiting (the demo has others) and prices it.
        const desk = await deskContext.newPage();
        desk.on('pageerror', (error) => failures.push(error.message));
        await signIn(desk, 'sales@demo.test', /\/desk$/);
        await desk.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Quote requests' }).click();
        await desk.getByRole('link', { name: `Request ${requestId}`, exact: true }).waitFor();
        await expectAccessible(desk);
        await desk.getByRole('link', { name: `Request ${requestId}`, exact: true }).click();
        await desk.waitForURL(new RegExp(`/desk/quotes/${requestId}$`));
        await desk.getByRole('heading', { name: 'Tollerbeck Yard: Waiting for a price' }).waitFor();
        await expectAccessible(desk);

        const asked = await api<RequestDetail>(desk, 'GET', `/api/quote-requests/${requestId}`);
        expect(asked.lines.length).toBeGreaterThanOrEqual(5);
        const priceForm = desk.getByRole('form', { name: 'Price the quote' });
        const tileLine = asked.lines.find((l) => l.category === 'tile')!;
        const battenLine = asked.lines.find((l) => l.category === 'batten')!;
        // Each line gets the branch's own product of its kind, the one the estimate was made with.
        for (const line of asked.lines) {
          const select = priceForm.getByLabel(`Product for ${line.description}`, { exact: true });
          const value = await select.locator('option', { hasText: skuOf.get(line.category)! }).getAttribute('value');
          await select.selectOption(value!);
        }
        // A job price on the tiles, and the battens in whole bundles of 10 lengths with a spare bundle (bundles of ten: common practice at a timber counter).
        await priceForm.getByLabel(`Pack price of ${tileLine.description}`, { exact: true }).fill((TILE_JOB_PRICE / 100).toFixed(2));
        const battenPacks = Math.ceil(battenLine.quantity / 10) * 10 + 10;
        await priceForm.getByLabel(`Packs of ${battenLine.description}`, { exact: true }).fill(String(battenPacks));
        await priceForm.getByLabel(`Note on ${battenLine.description}`, { exact: true }).fill('Whole bundles of ten, one spare');
        await priceForm.getByLabel('Message to the contractor').fill('Job price on the tiles for the whole site.');
        await priceForm.getByRole('button', { name: 'Send the quote' }).click();
        await desk.getByRole('heading', { name: 'Tollerbeck Yard: Priced' }).waitFor();

        const priced = await api<RequestDetail>(desk, 'GET', `/api/quote-requests/${requestId}`);
        const yardQuote = priced.quotes.find((q) => q.branch.id === yard.id)!;
        expect(yardQuote.status).toBe('answered');
        expect(yardQuote.lines.length).toBe(asked.lines.length);
        const tileQuote = yardQuote.lines.find((l) => l.request_line_id === tileLine.id)!;
        // One tile to a pack, so the packs are the tiles asked for, rounded up.
        expect(tileQuote.packs).toBe(Math.ceil(tileLine.quantity));
        expect(tileQuote.unit_price).toBe(TILE_JOB_PRICE);
        expect(tileQuote.total).toBe(tileQuote.packs * TILE_JOB_PRICE);
        expect(yardQuote.lines.find((l) => l.request_line_id === battenLine.id)!.packs).toBe(battenPacks);
        expect(yardQuote.total).toBe(yardQuote.lines.reduce((sum, l) => sum + l.total, 0));

        // Caddonmere Wharf prices only its battens and underlay (it has no Flatlock tiles).
        const other = await otherDeskContext.newPage();
        await signIn(other, 'sales2@demo.test', /\/desk$/);
        // Each desk sees only its own branches' quotes of a request.
        expect(priced.quotes.map((q) => q.branch.id)).toEqual([yard.id]);
        const wharfQuote = (await api<RequestDetail>(other, 'GET', `/api/quote-requests/${requestId}`)).quotes.find((q) => q.branch.id === wharf.id)!;
        const { items } = await api<{ items: { product_id: number; category: string; sku: string }[] }>(other, 'GET', `/api/branches/${wharf.id}/stock`);
        const offered = asked.lines
          .filter((l) => l.category === 'batten' || l.category === 'underlay')
          .map((l) => ({ request_line_id: l.id, product_id: items.find((i) => i.category === l.category && i.sku.endsWith(l.category === 'batten' ? '3825' : '50'))!.product_id }));
        await api(other, 'POST', `/api/quotes/${wharfQuote.id}/answer`, { lines: offered, message: 'Battens and underlay only.' });

        // The estimator compares the answers side by side.
        await estimator.reload();
        const table = estimator.getByRole('table', { name: 'The answers side by side' });
        await table.waitFor();
        await expectAccessible(estimator);
        const tileRow = table.getByRole('row').filter({ hasText: tileLine.description });
        expect(await tileRow.innerText()).toContain('Not offered');
        expect(await tileRow.innerText()).toContain(`× £${(TILE_JOB_PRICE / 100).toFixed(2)}`);
        expect(await estimator.getByText(`${asked.lines.length} lines priced`, { exact: true }).count()).toBe(1);
        expect(await estimator.getByText(`2 lines priced, ${asked.lines.length - 2} not offered`, { exact: true }).count()).toBe(1);

        // …and accepts Tollerbeck Yard's, the one that prices every line.
        const yardHead = estimator
          .locator('div')
          .filter({ has: estimator.getByText('Tollerbeck Yard, Tollerbeck', { exact: true }) })
          .filter({ has: estimator.getByRole('button', { name: 'Accept this quote' }) })
          .last();
        await yardHead.getByRole('button', { name: 'Accept this quote' }).click();
        await estimator.getByRole('group', { name: 'Accept the quote from Tollerbeck Yard?' }).getByRole('button', { name: 'Yes, order from Tollerbeck Yard' }).click();
        await estimator.waitForURL(/\/orders\/\d+$/);
        const orderId = Number(new URL(estimator.url()).pathname.split('/').pop());
        await estimator.getByRole('heading', { level: 1, name: /^Order RL-\d{6}$/ }).waitFor();
        await estimator.getByText('Sent to the merchant').first().waitFor();
        await expectAccessible(estimator);

        // The order carries the quoted products, packs and prices, and the request is closed.
        const order = await api<{ quote_id: number; po_reference: string; reference: string; subtotal: number; lines: { sku: string; quantity: number; unit_price: number }[] }>(
          estimator,
          'GET',
          `/api/orders/${orderId}`,
        );
        expect(order.quote_id).toBe(yardQuote.id);
        expect(order.po_reference).toBe('HB-QUOTE-E2E');
        expect(order.lines.map((l) => [l.sku, l.quantity, l.unit_price]).sort()).toEqual(yardQuote.lines.map((l) => [l.sku, l.packs, l.unit_price]).sort());
        expect(order.subtotal).toBe(yardQuote.total);
        const closed = await api<RequestDetail>(estimator, 'GET', `/api/quote-requests/${requestId}`);
        expect(closed.status).toBe('accepted');
        expect(closed.quotes.find((q) => q.branch.id === wharf.id)!.status).toBe('not_chosen');

        // The desk sees the order in its book, found by its reference among the demo orders.
        await desk.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Order book' }).click();
        const row = desk.getByRole('table', { name: 'Order book' }).getByRole('row', { name: new RegExp(order.reference) });
        await row.waitFor();
        expect(await row.innerText()).toContain('Hollin Brow');
        await expectAccessible(desk);

        expect(failures).toEqual([]);
      } finally {
        await estimatorContext.close();
        await deskContext.close();
        await otherDeskContext.close();
      }
    },
  );
});
