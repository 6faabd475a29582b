import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { pageApi } from '../setup/e2e-pages';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

/** A weekday three to seven days ahead as YYYY-MM-DD: inside the demo slot calendar, never a weekend. */
function nextWorkingDay(): string {
  for (let d = 3; ; d++) {
    const day = new Date(Date.now() + d * 86_400_000);
    if (day.getUTCDay() !== 0 && day.getUTCDay() !== 6) return day.toISOString().slice(0, 10);
  }
}

const signIn = (page: Page, email: string, home: RegExp) => journey.signIn(page, email, home);

interface Placed {
  id: number;
  reference: string;
}

/**
 * The estimator's order, sent through the API from the signed-in page (the estimator journey
 * covers placing it through the form): an estimate of the demo site from a Tollerbeck Yard system,
 * then a small order of its first lines, so one lorry can carry it.
 */
async function placeOrderAsEstimator(page: Page, date: string): Promise<Placed> {
  return page.evaluate(async (requestedDate) => {
    const json = async (path: string, init?: RequestInit) => {
      const response = await fetch(path, { ...init, headers: { 'Content-Type': 'application/json', Accept: 'application/json', ...(init?.headers ?? {}) } });
      const body = (await response.json()) as Record<string, unknown>;
      if (!response.ok) throw new Error(`${init?.method ?? 'GET'} ${path}: ${response.status} ${JSON.stringify(body)}`);
      return body as Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
    };
    const { token } = await json('/api/auth/csrf');
    const post = (path: string, body: unknown) => json(path, { method: 'POST', body: JSON.stringify(body), headers: { 'X-CSRF-Token': token } });
    const { projects } = await json('/api/projects?q=Hollin%20Brow');
    const { branches } = await json('/api/merchant-branches');
    const branch = branches.find((b: { name: string }) => b.name === 'Tollerbeck Yard');
    const { systems } = await json(`/api/systems?branch_id=${branch.id}`);
    const estimate = await post(`/api/projects/${projects[0].id}/estimates`, { system_id: systems[0].id });
    const lines = estimate.lines
      .filter((l: { product_id: number | null }) => l.product_id !== null)
      .slice(0, 3)
      .map((l: { product_id: number }) => ({ product_id: l.product_id, quantity: 1 }));
    const order = await post('/api/orders', { estimate_id: estimate.id, branch_id: branch.id, requested_date: requestedDate, delivery_method: 'ground', po_reference: 'HB-DESK-1', lines });
    return { id: order.id as number, reference: order.reference as string };
  }, date);
}

describe('the demo desk confirms the order the demo estimator placed', () => {
  // A long story with an accessibility check on every page it opens: each check takes seconds on a busy machine.
  it('the estimator orders, the desk confirms it into a lorry slot, the estimator sees the slot; once delivered the desk invoices it and the estimator pays by card', { timeout: 480_000 }, async () => {
    const date = nextWorkingDay();
    const estimatorContext = await journey.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const deskContext = await journey.browser.newContext({ viewport: { width: 1440, height: 900 } });
    const failures: string[] = [];
    try {
      const estimator = await estimatorContext.newPage();
      estimator.on('pageerror', (error) => failures.push(error.message));
      await signIn(estimator, 'estimator@demo.test', /\/contractor$/);
      const placed = await placeOrderAsEstimator(estimator, date);
      expect(placed.reference).toMatch(/^RL-\d{6}$/);

      // The desk finds it in the order book, waiting for an answer.
      const desk = await deskContext.newPage();
      desk.on('pageerror', (error) => failures.push(error.message));
      await signIn(desk, 'sales@demo.test', /\/desk$/);
      await desk.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Order book' }).click();
      await desk.getByLabel('Stage').selectOption({ label: 'Waiting for the desk' });
      const row = desk.getByRole('table', { name: 'Order book' }).getByRole('row', { name: new RegExp(placed.reference) });
      await row.waitFor();
      expect(await row.innerText()).toContain('Hollin Brow');
      await expectAccessible(desk);
      await row.getByRole('link', { name: placed.reference }).click();
      await desk.waitForURL(new RegExp(`/desk/orders/${placed.id}$`));

      // Confirm every line as the branch's stock allows, into the first slot with room on the day asked.
      const confirmForm = desk.getByRole('form', { name: 'Confirm the order' });
      await confirmForm.waitFor();
      const slots = confirmForm.getByRole('list', { name: /^Slots on / });
      await slots.waitFor();
      await expectAccessible(desk);
      // A slot whose lorry has the demo driver, so the driver's own page can record the drop.
      const free = slots
        .getByRole('listitem')
        .filter({ has: desk.getByRole('radio', { disabled: false }), hasText: 'driver Kofi Brennagh' })
        .first();
      const slotText = await free.innerText();
      const [windowText, lorryText] = slotText.split('\n')[0].split(' · ');
      const window = windowText.trim();
      const registration = lorryText.trim().split(' ')[0];
      await free.getByRole('radio').check();
      await confirmForm.getByRole('button', { name: 'Confirm and reserve the stock' }).click();
      await desk.getByText('Confirmed', { exact: true }).first().waitFor();
      const booked = desk.getByRole('definition').filter({ hasText: window });
      await booked.first().waitFor();
      expect(await desk.getByLabel('Booked delivery').innerText()).toContain(registration);
      await expectAccessible(desk);

      // What the desk confirmed is held from the branch's stock: every packed line reserved as sent.
      const confirmed = await desk.request.get(`${journey.server.url}/api/orders/${placed.id}`);
      const detail = (await confirmed.json()) as { status: string; lines: { confirmed_quantity: number | null; reserved_quantity: number }[]; slot: { time_window: string } | null };
      expect(detail.status).toBe('confirmed');
      expect(detail.slot?.time_window).toBe(window);
      for (const line of detail.lines) expect(line.reserved_quantity).toBe(line.confirmed_quantity);

      // The estimator sees the order confirmed, with the day, window and lorry booked.
      await estimator.goto(`${journey.server.url}/orders/${placed.id}`);
      await estimator.getByRole('heading', { level: 1, name: `Order ${placed.reference}` }).waitFor();
      const bookedSlot = estimator.getByTestId('booked-slot');
      await expect.poll(() => bookedSlot.innerText()).toContain(window);
      expect(await bookedSlot.innerText()).toContain(registration);
      expect(await estimator.getByText('Confirmed').count()).toBeGreaterThan(0);
      await expectAccessible(estimator);

      // The yard sends it out; the driver records the drop on the phone.
      const yardContext = await journey.browser.newContext();
      const driverContext = await journey.browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
      try {
        const yard = await yardContext.newPage();
        await signIn(yard, 'dispatch@demo.test', /\/yard$/);
        yard.on('pageerror', (error) => failures.push(error.message));
        // The dispatcher finds the booking on the slot calendar, where it opens its run, and sends the lorry out.
        await yard.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Lorries and slots' }).click();
        await yard.waitForURL(/\/fleet$/);
        const branchValue = await yard.getByLabel('Branch', { exact: true }).locator('option', { hasText: 'Tollerbeck Yard' }).getAttribute('value');
        await yard.getByLabel('Branch', { exact: true }).selectOption(branchValue!);
        await yard.getByRole('region', { name: 'Slot calendar' }).getByLabel('Day', { exact: true }).fill(date);
        const booking = yard
          .getByRole('list', { name: /^Orders on / })
          .getByRole('listitem')
          .filter({ hasText: placed.reference });
        await booking.waitFor();
        await expectAccessible(yard);
        // The run is for the next working day: the dispatcher sends it out ahead of its day, with a reason.
        await booking.getByRole('link', { name: `${placed.reference}: open its run` }).click();
        await yard.waitForURL(/\/yard\/runs\/\d+$/);
        await yard.getByRole('button', { name: 'Send out anyway…' }).waitFor();
        await expectAccessible(yard);
        await yard.getByRole('button', { name: 'Send out anyway…' }).click();
        const override = yard.getByRole('form', { name: 'Send out anyway' });
        await override.waitFor();
        await expectAccessible(yard);
        await override.getByLabel('Reason for sending out anyway').fill('Site asked for it a day early');
        await override.getByRole('button', { name: 'Send out with this reason' }).click();
        await yard
          .getByTestId('send-out')
          .filter({ hasText: /^On the road/ })
          .waitFor();
        await expectAccessible(yard);
        const sentOut = await pageApi<{ status: string; timeline: { summary: string }[] }>(yard, 'GET', `/api/orders/${placed.id}`);
        expect(sentOut.status).toBe('on_the_road');
        expect(sentOut.timeline.map((e) => e.summary).join(' ')).toContain('Site asked for it a day early');

        const driver = await driverContext.newPage();
        driver.on('pageerror', (error) => failures.push(error.message));
        await signIn(driver, 'driver@demo.test', /\/driver$/);
        await driver.getByLabel('Day', { exact: true }).fill(date);
        const stop = driver.getByRole('article').filter({ hasText: placed.reference });
        await stop.waitFor();
        expect(await stop.getByTestId('pallet').count()).toBeGreaterThan(0);
        await expectAccessible(driver);
        await stop.getByText('Record the delivery').click();
        await stop.getByLabel('Taken by (name)').fill('Gethin Marlow');
        // No finger signature in a headless browser: the receiver's name typed again confirms instead.
        await stop.getByLabel(/type the receiver.s name again to confirm/).fill('Gethin Marlow');
        await expectAccessible(driver);
        const delivered = stop.getByRole('button', { name: 'Delivered' });
        // A gloved thumb: the button is at least 56 px tall.
        expect((await delivered.boundingBox())!.height).toBeGreaterThanOrEqual(56);
        await delivered.click();
        // The drop folds to its header line, marked delivered.
        await stop.getByText('Delivered', { exact: true }).waitFor();
        await expectAccessible(driver);
      } finally {
        await yardContext.close();
        await driverContext.close();
      }

      // The desk's catalogue shows the branch's stock with what this order holds reserved.
      await desk.goto(`${journey.server.url}/catalogue`);
      const catalogueBranch = desk.getByLabel('Branch', { exact: true });
      await catalogueBranch.selectOption((await catalogueBranch.locator('option', { hasText: 'Tollerbeck Yard' }).getAttribute('value'))!);
      const stockTable = desk.getByRole('table', { name: 'Stock at Tollerbeck Yard' });
      await stockTable.waitFor();
      expect(await stockTable.getByRole('row').count()).toBeGreaterThan(1);
      await expectAccessible(desk);

      // This firm has account terms with the merchant; the desk takes them off so this invoice is paid by card.
      const me = (await (await estimator.request.get(`${journey.server.url}/api/auth/me`)).json()) as { organisation: { id: number } };
      const deskToken = ((await (await desk.request.get(`${journey.server.url}/api/auth/csrf`)).json()) as { token: string }).token;
      const offAccount = await desk.request.delete(`${journey.server.url}/api/accounts/${me.organisation.id}`, { headers: { 'X-CSRF-Token': deskToken } });
      expect([200, 204]).toContain(offAccount.status());

      // The desk invoices what was delivered.
      await desk.goto(`${journey.server.url}/desk/orders/${placed.id}`);
      await desk.getByRole('button', { name: 'Issue the invoice for what was delivered' }).waitFor();
      await expectAccessible(desk);
      await desk.getByRole('button', { name: 'Issue the invoice for what was delivered' }).click();
      await desk.waitForURL(/\/invoices\/\d+$/);
      const invoiceHeading = await desk.getByRole('heading', { level: 1, name: /^Invoice INV-\d{6}$/ }).innerText();
      const invoiceNumber = invoiceHeading.replace('Invoice ', '');
      await expectAccessible(desk);
      expect(await desk.getByRole('link', { name: 'Printable invoice' }).getAttribute('href')).toMatch(/\/api\/invoices\/\d+\/print$/);
      const invoiceId = Number(new URL(desk.url()).pathname.split('/').pop());
      const invoice = (await (await desk.request.get(`${journey.server.url}/api/invoices/${invoiceId}`)).json()) as {
        basis: string;
        total: number;
        balance: number;
        order: { id: number };
        lines: { net: number; tax: number; total: number; tax_rate_bp: number }[];
      };
      expect(invoice.basis).toBe('delivered');
      // A merchant charges building materials to a contractor at the UK standard VAT rate, 20 % (GOV.UK, "VAT rates",
      // gov.uk/vat-rates; the demo catalogue is priced that way), taxed on each line's net.
      for (const line of invoice.lines) {
        expect(line.tax_rate_bp).toBe(2000);
        expect(line.tax).toBe(Math.round(line.net * 0.2));
        expect(line.total).toBe(line.net + line.tax);
      }
      expect(invoice.total).toBe(invoice.lines.reduce((sum, l) => sum + l.total, 0));
      expect(invoice.order.id).toBe(placed.id);
      expect(invoice.balance).toBe(invoice.total);

      // The estimator finds it from the order and sees what is owed.
      await estimator.reload();
      await estimator.getByRole('link', { name: `${invoiceNumber}: view and pay` }).waitFor();
      await expectAccessible(estimator);
      await estimator.getByRole('link', { name: `${invoiceNumber}: view and pay` }).click();
      await estimator.waitForURL(new RegExp(`/invoices/${invoiceId}$`));
      await estimator.getByRole('heading', { level: 1, name: `Invoice ${invoiceNumber}` }).waitFor();
      expect(await estimator.getByTestId('invoice-balance').innerText()).toMatch(/^£[\d,]+\.\d{2}$/);
      await expectAccessible(estimator);

      // …and pays it by card on the payment service's own page (the local fake): the card number never
      // reaches Ridgeload. 4242 4242 4242 4242 is the payment service's published always-succeeds test card.
      await estimator.getByRole('button', { name: /^Pay £[\d,]+\.\d{2} by card$/ }).click();
      await estimator.waitForURL((url) => url.href.startsWith(journey.server.paymentsUrl));
      await estimator.getByLabel('Card number').fill('4242 4242 4242 4242');
      await estimator.getByLabel('Expiry (MM/YY)').fill('12/30');
      await estimator.getByLabel('Security code').fill('123');
      await estimator.getByRole('button', { name: /^Pay / }).click();
      await estimator.waitForURL(new RegExp(`/invoices/${invoiceId}\\?payment=done`));
      await estimator.getByText('Payment received').waitFor({ timeout: 20_000 });
      // The card page between is the payment service's own (a local stand-in here), not Ridgeload's.
      await expectAccessible(estimator);
      const paid = (await (await estimator.request.get(`${journey.server.url}/api/invoices/${invoiceId}`)).json()) as { balance: number; payments: { status: string; amount: number }[] };
      expect(paid.balance).toBe(0);
      expect(paid.payments.filter((pay) => pay.status === 'succeeded').map((pay) => pay.amount)).toEqual([invoice.total]);

      expect(failures).toEqual([]);
    } finally {
      await estimatorContext.close();
      await deskContext.close();
    }
  });
});
