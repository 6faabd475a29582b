import { PDFParse } from 'pdf-parse';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { BusinessCalendar, DEFAULT_BUSINESS_TIME_ZONE } from '../../shared/domain/business-calendar';
import { pageApi } from '../setup/e2e-pages';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

// The demo seed books two drops on the tail-lift lorry's afternoon run of today (the firm's calendar):
// Wrenhallow's plain tiles (PO FR-CL-3) first, their pallets ticked loaded, and Brackenfold's felt and battens
// (PO HB-FB-07) second, not yet loaded.
const REGISTRATION = 'RL-TY02';
const AFTERNOON = '12:30-16:30';

interface RunJson {
  id: number;
  date: string;
  status: string;
  drops: { order_id: number; reference: string; position: number; status: string; contractor: { name: string } }[];
  deck: { positions: { loaded: boolean }[] };
}

const dropRefs = async (page: Page) =>
  (
    await page
      .getByRole('list', { name: `Drops of ${REGISTRATION} in order, the first off first` })
      .getByTestId('drop-row')
      .allInnerTexts()
  ).map((t) => /RL-\d+/.exec(t)?.[0] ?? t);

describe('the yard builds today’s load and sends the lorry out by the rule', () => {
  // A long story with an accessibility check on every page it opens: each check takes seconds on a busy machine.
  it('the dispatcher opens today’s run, swaps its drops with the arrow buttons, ticks every pallet loaded, prints the labels and sends it out without an override', { timeout: 300_000 }, async () => {
    const today = new BusinessCalendar(process.env.BUSINESS_TIME_ZONE ?? DEFAULT_BUSINESS_TIME_ZONE).today();
    const context = await journey.browser.newContext({ viewport: { width: 1440, height: 900 } });
    try {
      const yard = await context.newPage();
      await journey.signIn(yard, 'dispatch@demo.test', /\/yard$/);

      // The day plan opens on today, and today's afternoon run of the tail-lift lorry is on it.
      const dayPlan = yard.getByRole('region', { name: 'Runs of the day' });
      await expect.poll(() => dayPlan.getByRole('heading', { level: 2 }).innerText()).toMatch(/\(today\)$/);
      await yard.getByLabel('Branch', { exact: true }).selectOption({ label: 'Tollerbeck Yard, Tollerbeck' });
      const card = dayPlan.getByRole('listitem', { name: `${AFTERNOON} · ${REGISTRATION}` });
      await card.waitFor();
      await expectAccessible(yard);
      expect(await card.getByRole('list', { name: `Drops of ${AFTERNOON} · ${REGISTRATION}, the first off first` }).innerText()).toMatch(/^1\. RL-\d+ · Wrenhallow[\s\S]*\n2\. RL-\d+ · Brackenfold/);
      await card.getByRole('link', { name: `Open the run ${AFTERNOON} · ${REGISTRATION}` }).click();
      await yard.waitForURL(/\/yard\/runs\/\d+$/);
      const runId = Number(/\/yard\/runs\/(\d+)$/.exec(yard.url())![1]);
      const before = await pageApi<RunJson>(yard, 'GET', `/api/runs/${runId}`);
      expect(before.date).toBe(today);
      expect(before.drops.map((d) => d.contractor.name)).toEqual(['Wrenhallow Slate & Tile', 'Brackenfold Roofworks']);
      const [TILES, BATTENS] = before.drops.map((d) => d.reference);

      // Today but not every pallet ticked: no plain send-out yet, and the page says why.
      const why = yard.getByRole('list', { name: 'Why it cannot go yet' });
      await why.waitFor();
      expect(await why.innerText()).toMatch(/not ticked loaded/);
      expect(await why.innerText()).not.toMatch(/Not before its day/);
      expect(await yard.getByRole('button', { name: `Send out ${REGISTRATION}` }).count()).toBe(0);
      await expectAccessible(yard);

      // The felt and battens go first off with its up arrow (a keyboard press on the button); the order holds after a reload.
      await expect.poll(() => dropRefs(yard)).toEqual([TILES, BATTENS]);
      await yard.getByRole('button', { name: `Move ${BATTENS} up` }).focus();
      await yard.keyboard.press('Enter');
      await expect.poll(() => dropRefs(yard)).toEqual([BATTENS, TILES]);
      await expect.poll(async () => (await pageApi<RunJson>(yard, 'GET', `/api/runs/${runId}`)).drops.map((d) => d.reference)).toEqual([BATTENS, TILES]);
      await yard.reload();
      // The reloaded page fetches its code and the run again: on a busy machine that takes more than a second.
      await expect.poll(() => dropRefs(yard), { timeout: 20_000 }).toEqual([BATTENS, TILES]);
      // The deck is planned again: the battens' pallets are drop 1 now, the tiles' (still ticked) drop 2.
      const legend = yard.getByRole('list', { name: 'Drops on the drawing' });
      await expect.poll(() => legend.innerText()).toMatch(new RegExp(`D1 ${BATTENS}[\\s\\S]*D2 ${TILES}`));

      // Every pallet ticked: the first still open on the deck drawing, the rest in the list.
      const deck = yard.getByRole('region', { name: `Deck plan of ${REGISTRATION}` });
      const total = before.deck.positions.length;
      const loadedBefore = before.deck.positions.filter((p) => p.loaded).length;
      expect(loadedBefore).toBeGreaterThan(0);
      expect(loadedBefore).toBeLessThan(total);
      await deck.getByText(`${loadedBefore} of ${total}`, { exact: true }).waitFor();
      const drawing = deck.getByTestId('deck-drawing');
      await drawing.locator('[data-testid="deck-pallet"][aria-pressed="false"]').first().click();
      await deck.getByText(`${loadedBefore + 1} of ${total}`, { exact: true }).waitFor();
      const list = deck.getByRole('list', { name: 'Pallets in loading order' });
      for (;;) {
        const open = list.getByRole('checkbox', { checked: false });
        const left = await open.count();
        if (left === 0) break;
        await open.first().check();
        await expect.poll(() => list.getByRole('checkbox', { checked: false }).count()).toBe(left - 1);
      }
      await deck.getByText(`${total} of ${total}`, { exact: true }).waitFor();
      expect(await drawing.locator('[data-testid="deck-pallet"][data-loaded="true"]').count()).toBe(total);
      expect(await drawing.getByTestId('deck-tick').count()).toBe(total);
      await yard.getByText('Loaded, ready to go', { exact: true }).first().waitFor();

      // The labels print from their link: a real PDF naming both drops' orders.
      const labelsLink = yard.getByRole('group', { name: 'Print' }).getByRole('link', { name: 'Pallet labels (PDF)' });
      const href = await labelsLink.getAttribute('href');
      expect(href).toBe(`/api/runs/${runId}/labels.pdf`);
      const labels = await context.request.get(`${journey.server.url}${href}`);
      expect(labels.status()).toBe(200);
      expect(labels.headers()['content-type']).toMatch(/^application\/pdf/);
      const pdf = await labels.body();
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
      const parser = new PDFParse({ data: new Uint8Array(pdf) });
      const { text } = await parser.getText().finally(() => void parser.destroy());
      expect(text).toContain(BATTENS);
      expect(text).toContain(TILES);

      // Its day, all ticked: the plain button sends it out, no reason asked.
      expect(await yard.getByRole('list', { name: 'Why it cannot go yet' }).count()).toBe(0);
      expect(await yard.getByRole('button', { name: 'Send out anyway…' }).count()).toBe(0);
      await yard.getByRole('button', { name: `Send out ${REGISTRATION}` }).click();
      await yard
        .getByTestId('send-out')
        .filter({ hasText: /^On the road since / })
        .waitFor();
      await yard.getByText(`${REGISTRATION} is on the road.`).waitFor();
      // Once gone, the drops and the deck are fixed.
      expect(await yard.getByRole('button', { name: `Move ${TILES} up` }).count()).toBe(0);
      expect(await deck.getByRole('checkbox', { disabled: false }).count()).toBe(0);

      const after = await pageApi<RunJson>(yard, 'GET', `/api/runs/${runId}`);
      expect(after.status).toBe('on_the_road');
      expect(after.drops.map((d) => [d.reference, d.status])).toEqual([
        [BATTENS, 'on_the_road'],
        [TILES, 'on_the_road'],
      ]);
      // No override was recorded: the order's timeline has the send-out, and no "against the rule" entry.
      const order = await pageApi<{ status: string; timeline: { kind: string; summary: string }[] }>(yard, 'GET', `/api/orders/${after.drops[0].order_id}`);
      expect(order.status).toBe('on_the_road');
      expect(order.timeline.length).toBeGreaterThan(0);
      expect(order.timeline.map((e) => e.summary).join('\n')).not.toMatch(/against the rule/);
    } finally {
      await context.close();
    }
  });
});
