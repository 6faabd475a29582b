import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { pageApi } from '../setup/e2e-pages';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

const DAY = 86_400_000;
const iso = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** The first Monday at least fifteen days ahead: past the demo calendar, so the new lorry's week is its own. */
function mondayAhead(): string {
  for (let d = 15; ; d++) if (new Date(Date.now() + d * DAY).getUTCDay() === 1) return iso(Date.now() + d * DAY);
}

const signIn = (page: Page, email: string, home: RegExp) => journey.signIn(page, email, home);

const api = pageApi;

interface SlotDay {
  slots: { id: number; time_window: string; lorry: { registration: string }; driver: { id: number; name: string } | null; booked_kg: number; bookings: { order_id: number; weight_kg: number }[] }[];
}

const REGISTRATION = 'RL-TY07';
const LORRY_NAME = 'Two-axle rigid with crane';
const WINDOWS = ['07:30-12:00', '12:30-16:30'];

describe('the demo yard adds a lorry, gives it a week of slots and sends a booked order out with a driver', () => {
  // A long story with an accessibility check on every page it opens: each check takes seconds on a busy machine.
  it('the dispatcher adds a crane lorry, makes its slots for a run of weekdays, sees them on the calendar, and puts the driver on a booked run before sending it out', { timeout: 300_000 }, async () => {
    const monday = mondayAhead();
    const sunday = iso(Date.parse(`${monday}T00:00:00Z`) + 6 * DAY);
    const saturday = iso(Date.parse(`${monday}T00:00:00Z`) + 5 * DAY);
    const yardContext = await journey.browser.newContext({ viewport: { width: 1440, height: 900 } });
    const estimatorContext = await journey.browser.newContext();
    const deskContext = await journey.browser.newContext();
    const failures: string[] = [];
    try {
      const yard = await yardContext.newPage();
      yard.on('pageerror', (error) => failures.push(error.message));
      await signIn(yard, 'dispatch@demo.test', /\/yard$/);
      await yard.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Lorries and slots' }).click();
      await yard.waitForURL(/\/fleet$/);
      await yard.getByLabel('Branch', { exact: true }).selectOption({ label: 'Tollerbeck Yard, Tollerbeck' });
      await yard.getByRole('form', { name: 'Add a lorry' }).waitFor();
      await expectAccessible(yard);

      // A two-axle rigid: 18,000 kg gross (Road Vehicles (Authorised Weight) Regulations 1998) less about
      // 9,000 kg of lorry and crane leaves 9,000 kg to carry; the crane limit is the demo's own figure.
      const lorryForm = yard.getByRole('form', { name: 'Add a lorry' });
      await lorryForm.getByLabel('Registration').fill(REGISTRATION);
      await lorryForm.getByLabel('Name on the board (optional)').fill(LORRY_NAME);
      await lorryForm.getByLabel('Payload (kg)').fill('9000');
      await lorryForm.getByLabel('Pallet slots on the bed').fill('8');
      await lorryForm.getByLabel('Has a crane (lorry-mounted)').check();
      await lorryForm.getByLabel('Crane lifting limit (kg)').fill('900');
      await lorryForm.getByRole('button', { name: 'Add the lorry' }).click();
      await yard.getByText(`${REGISTRATION} is added.`).waitFor();
      await yard.getByText(`${REGISTRATION} · ${LORRY_NAME}`, { exact: false }).first().waitFor();

      // A week of its slots: two windows on each of the five working days, Monday to Friday by default.
      const generate = yard.getByRole('form', { name: 'Make slots for a run of days' });
      await generate.getByLabel('First day').fill(monday);
      await generate.getByLabel('Last day').fill(sunday);
      await generate.getByLabel('Time windows').fill(WINDOWS.join(', '));
      await generate.getByLabel(`${REGISTRATION} · ${LORRY_NAME}`).check();
      for (const day of ['Mon', 'Tue', 'Wed', 'Thu', 'Fri']) expect(await generate.getByLabel(day, { exact: true }).isChecked()).toBe(true);
      expect(await generate.getByLabel('Sat', { exact: true }).isChecked()).toBe(false);
      await generate.getByRole('button', { name: 'Make the slots' }).click();
      await yard.getByText(`${5 * WINDOWS.length} slots made.`, { exact: true }).waitFor();
      // Made again, the calendar keeps the slots it has.
      await generate.getByRole('button', { name: 'Make the slots' }).click();
      await yard.getByText(`0 slots made, ${5 * WINDOWS.length} already there.`, { exact: true }).waitFor();

      // The calendar shows both runs on the Monday, empty, and none on the Saturday.
      const calendar = yard.getByRole('region', { name: 'Slot calendar' });
      const runOf = (window: string) => calendar.getByRole('listitem').filter({ has: yard.getByRole('heading', { name: new RegExp(`^${window} · ${REGISTRATION}`) }) });
      await calendar.getByLabel('Day', { exact: true }).fill(monday);
      for (const w of WINDOWS) {
        await runOf(w).waitFor();
        expect(await runOf(w).innerText()).toContain('Nothing booked.');
        expect(await runOf(w).innerText()).toContain('0 kg of 9,000 kg');
      }
      await calendar.getByLabel('Day', { exact: true }).fill(saturday);
      await expect.poll(() => runOf(WINDOWS[0]).count()).toBe(0);
      await expectAccessible(yard);

      // An order of the demo estimator, confirmed by the desk into the new lorry's Monday morning (through the API:
      // the desk journey covers confirming on screen).
      const estimator = await estimatorContext.newPage();
      await signIn(estimator, 'estimator@demo.test', /\/contractor$/);
      const { projects } = await api<{ projects: { id: number }[] }>(estimator, 'GET', '/api/projects?q=Hollin%20Brow');
      const { branches } = await api<{ branches: { id: number; name: string }[] }>(estimator, 'GET', '/api/merchant-branches');
      const branch = branches.find((b) => b.name === 'Tollerbeck Yard')!;
      const { systems } = await api<{ systems: { id: number }[] }>(estimator, 'GET', `/api/systems?branch_id=${branch.id}`);
      const estimate = await api<{ id: number; lines: { product_id: number | null }[] }>(estimator, 'POST', `/api/projects/${projects[0].id}/estimates`, { system_id: systems[0].id });
      const lines = estimate.lines
        .filter((l) => l.product_id !== null)
        .slice(0, 3)
        .map((l) => ({ product_id: l.product_id!, quantity: 2 }));
      const order = await api<{ id: number; reference: string }>(estimator, 'POST', '/api/orders', {
        estimate_id: estimate.id,
        branch_id: branch.id,
        requested_date: monday,
        time_window: WINDOWS[0],
        delivery_method: 'ground',
        po_reference: 'HB-YARD-E2E',
        lines,
      });
      const desk = await deskContext.newPage();
      await signIn(desk, 'sales@demo.test', /\/desk$/);
      // The desk asks for the Monday until the new lorry's morning slot is listed (the board it reads may lag a moment).
      let before: SlotDay = { slots: [] };
      await expect
        .poll(
          async () => {
            before = await api<SlotDay>(desk, 'GET', `/api/branches/${branch.id}/slots?date=${monday}`);
            return before.slots.map((s) => `${s.lorry.registration} ${s.time_window}`);
          },
          { timeout: 15_000 },
        )
        .toContain(`${REGISTRATION} ${WINDOWS[0]}`);
      const morning = before.slots.find((s) => s.lorry.registration === REGISTRATION && s.time_window === WINDOWS[0])!;
      expect(morning.driver).toBeNull();
      await api(desk, 'POST', `/api/orders/${order.id}/confirm`, { slot_id: morning.id });

      // The dispatcher opens the board again and sees it on the run; with no driver yet the lorry cannot go out.
      await yard.reload();
      await yard.getByLabel('Branch', { exact: true }).selectOption({ label: 'Tollerbeck Yard, Tollerbeck' });
      await calendar.getByLabel('Day', { exact: true }).fill(monday);
      const run = runOf(WINDOWS[0]);
      const booking = run
        .getByRole('list', { name: `Orders on ${REGISTRATION} ${WINDOWS[0]}` })
        .getByRole('listitem')
        .filter({ hasText: order.reference });
      await booking.waitFor();
      expect(await booking.innerText()).toContain('confirmed');
      await expectAccessible(yard);
      // The booked load opens its run in one click; the calendar itself sends nothing out.
      expect(await booking.getByRole('link', { name: `${order.reference}: open its run` }).getAttribute('href')).toBe(`/yard/runs/${morning.id}`);
      expect(await booking.getByRole('button', { name: 'Send out' }).count()).toBe(0);
      journey.consoleProblems.expectRefusal(`/api/orders/${order.id}/dispatch`, 409);
      await expect(api(yard, 'POST', `/api/orders/${order.id}/dispatch`, {})).rejects.toThrow(new RegExp(`409.*Assign a driver to ${REGISTRATION}`));
      expect(await booking.innerText()).toContain('confirmed');

      // The driver goes on the run, then the lorry goes out.
      await run.getByLabel('Driver', { exact: true }).selectOption({ label: 'Kofi Brennagh' });
      await yard.getByText('Driver assigned.').first().waitFor();
      // Its day is weeks away and nothing is ticked loaded: the run's page says so and offers no plain
      // send-out; the dispatcher overrides with a reason.
      await booking.getByRole('link', { name: `${order.reference}: open its run` }).click();
      await yard.waitForURL(new RegExp(`/yard/runs/${morning.id}$`));
      const why = yard.getByRole('list', { name: 'Why it cannot go yet' });
      await expect.poll(() => why.innerText()).toMatch(/Not before its day/);
      expect(await why.innerText()).toMatch(/not ticked loaded yet/);
      expect(await yard.getByRole('button', { name: `Send out ${REGISTRATION}` }).count()).toBe(0);
      await expectAccessible(yard);
      await yard.getByRole('button', { name: 'Send out anyway…' }).click();
      const override = yard.getByRole('form', { name: 'Send out anyway' });
      await override.waitFor();
      await expectAccessible(yard);
      await override.getByLabel('Reason for sending out anyway').fill('Site manager asked for it ahead of the day');
      await override.getByRole('button', { name: 'Send out with this reason' }).click();
      await yard
        .getByTestId('send-out')
        .filter({ hasText: /^On the road/ })
        .waitFor();
      await expectAccessible(yard);

      const after = await api<SlotDay>(yard, 'GET', `/api/branches/${branch.id}/slots?date=${monday}`);
      const sent = after.slots.find((s) => s.id === morning.id)!;
      expect(sent.driver?.name).toBe('Kofi Brennagh');
      expect(sent.bookings.map((b) => b.order_id)).toEqual([order.id]);
      expect(sent.booked_kg).toBeCloseTo(sent.bookings[0].weight_kg, 1);
      expect(sent.booked_kg).toBeGreaterThan(0);
      expect(sent.booked_kg).toBeLessThanOrEqual(9000);
      const detail = await api<{ status: string }>(yard, 'GET', `/api/orders/${order.id}`);
      expect(detail.status).toBe('on_the_road');

      expect(failures).toEqual([]);
    } finally {
      await yardContext.close();
      await estimatorContext.close();
      await deskContext.close();
    }
  });
});
