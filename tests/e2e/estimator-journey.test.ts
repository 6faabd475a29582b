import { mkdtemp, readFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

/** A day two weeks ahead as YYYY-MM-DD: always a day the merchant can still be asked for. */
function inTwoWeeks(): string {
  return new Date(Date.now() + 14 * 86_400_000).toISOString().slice(0, 10);
}

const signIn = (page: Page, email: string) => journey.signIn(page, email, /\/contractor$/);

/** The tile quantity on the bill's first line, as the page shows it ("22,176 tiles" → 22176). */
async function tilesOnTheBill(page: Page): Promise<number> {
  const row = page.getByRole('table', { name: 'Bill of materials' }).getByRole('row').nth(1);
  const text = await row.getByRole('cell').nth(2).innerText();
  return Number(text.replace(/[^0-9]/g, ''));
}

describe('an estimator goes from a CSV of roof faces to a placed order', () => {
  // A long story with an accessibility check on every page it opens: each check takes seconds on a busy machine.
  it('creates a site, fixes a bad cell in the preview, imports, estimates, exports and orders', { timeout: 300_000 }, async () => {
    const context = await journey.browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
    const page = await context.newPage();
    const failures: string[] = [];
    page.on('pageerror', (error) => failures.push(error.message));
    try {
      await signIn(page, 'estimator@demo.test');

      // A new site, with its access details for the lorry.
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sites' }).click();
      await page.getByRole('link', { name: 'New site' }).first().waitFor();
      await expectAccessible(page);
      await page.getByRole('link', { name: 'New site' }).first().click();
      await page.getByLabel('Site name').waitFor();
      await expectAccessible(page);
      await page.getByLabel('Site name').fill('Quarry Bank, plots 1–20');
      await page.getByLabel('Site address').fill('Quarry Bank, off Mill Lane, Tollerbeck');
      await page.getByLabel('Contact on site').fill('Rhian Fenwick');
      await page.getByLabel('Their phone').fill('07700 900 118');
      await page.getByLabel('Crane lift possible').check();
      await page.getByLabel('Where pallets are set down').fill('Compound by the site gate');
      await page.getByRole('button', { name: 'Create the site' }).click();
      await page.waitForURL(/\/sites\/\d+$/);
      await page.getByRole('heading', { level: 1, name: 'Quarry Bank, plots 1–20' }).waitFor();
      await expectAccessible(page);

      // The example file, with Birch Front's eaves typed in metres (row 6 of the sheet, column G).
      const example = await page.request.get(`${journey.server.url}/api/examples/roof-schedule.csv`);
      expect(example.ok()).toBe(true);
      const lines = (await example.text()).split('\r\n');
      expect(lines[5]).toBe('Birch,Front,8,40,5091,3900,9000,,verge,verge,ridge,Main');
      lines[5] = 'Birch,Front,8,40,5091,3900,9,,verge,verge,ridge,Main';

      await page.getByRole('link', { name: 'Import a schedule' }).click();
      await page.getByLabel('Choose a CSV file').waitFor({ state: 'attached' });
      await expectAccessible(page);
      await page.getByLabel('Choose a CSV file').setInputFiles({ name: 'roof-schedule.csv', mimeType: 'text/csv', buffer: Buffer.from(lines.join('\r\n')) });

      const badCell = page.getByLabel('Row 6, column G (eaves_mm)');
      await expect.poll(() => badCell.getAttribute('aria-invalid')).toBe('true');
      const message = page.getByTestId('cell-problem');
      expect(await message.count()).toBe(1);
      expect(await message.innerText()).toBe('looks like metres (9); give millimetres, e.g. 9000');
      expect(await page.getByRole('button', { name: 'Fix the marked cells to import' }).isDisabled()).toBe(true);
      await expectAccessible(page);

      // Fixed in place: the cell is checked again as it is typed.
      await badCell.fill('9000');
      await expect.poll(() => badCell.getAttribute('aria-invalid')).toBeNull();
      expect(await page.getByTestId('cell-problem').count()).toBe(0);
      await page.getByRole('button', { name: 'Import 7 faces' }).click();
      await page.waitForURL(/\/sites\/\d+$/);
      await page.getByText(/Version 1 · 7 faces/).waitFor();
      const faceTable = page.getByRole('table', { name: 'Roof faces' });
      expect(await faceTable.getByRole('row').count()).toBe(8);
      await expectAccessible(page);

      // An estimate from a demo merchant's system, previewed in the browser, then saved.
      await page.getByRole('link', { name: 'New estimate' }).click();
      await page.getByRole('radio', { name: /Flatlock 420 interlocking tile roof · Tollerbeck Yard/ }).check();
      const preview = page.getByTestId('estimate-preview');
      await preview.waitFor();
      const previewTiles = Number((await preview.locator('div', { hasText: 'Tiles to order' }).locator('dd').innerText()).replace(/[^0-9]/g, ''));
      expect(previewTiles).toBeGreaterThan(0);
      await expectAccessible(page);
      await page.getByRole('button', { name: 'Save the estimate' }).click();
      await page.waitForURL(/\/estimates\/\d+$/);
      const estimateId = Number(new URL(page.url()).pathname.split('/').pop());
      await page.getByRole('table', { name: 'Bill of materials' }).waitFor();

      // The browser's preview and the server's saved estimate are the same engine: the same tile count.
      expect(await tilesOnTheBill(page)).toBe(previewTiles);
      await expect.poll(() => page.getByTestId('face-drawing').count()).toBe(7);
      await expectAccessible(page);

      // The spreadsheet export, read back: its first bill line is the tiles the page shows.
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download .xlsx' }).click()]);
      expect(download.suggestedFilename()).toBe(`estimate-${estimateId}.xlsx`);
      const workbook = new ExcelJS.Workbook();
      // The browser is shared by the run's journeys and reached over a connection, so the file is saved here first.
      const saved = join(await mkdtemp(join(tmpdir(), 'ridgeload-export-')), download.suggestedFilename());
      await download.saveAs(saved);
      await workbook.xlsx.load((await readFile(saved)) as unknown as ArrayBuffer);
      const bill = workbook.getWorksheet('Bill of materials');
      expect(bill?.getRow(1).getCell(4).value).toBe('Quantity');
      expect(bill?.getRow(2).getCell(4).value).toBe(previewTiles);

      // The order to the branch whose system it is.
      await page.getByRole('link', { name: 'Order from Tollerbeck Yard' }).click();
      await page.getByLabel('Day wanted').waitFor();
      await expectAccessible(page);
      await page.getByLabel('Day wanted').fill(inTwoWeeks());
      await page.getByLabel('Your PO reference').fill('QB-E2E-1');
      await page.getByRole('button', { name: 'Send the order to Tollerbeck Yard' }).click();
      await page.waitForURL(/\/orders\/\d+$/);
      const heading = page.getByRole('heading', { level: 1, name: /^Order RL-/ });
      const reference = (await heading.innerText()).replace('Order ', '');
      expect(reference).toMatch(/^RL-\d{6}$/);
      await page.getByText('Sent to the merchant').first().waitFor();
      await expectAccessible(page);

      // And it is listed with the firm's orders.
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Orders' }).click();
      const orders = page.getByRole('table', { name: 'Orders' });
      const row = orders.getByRole('row', { name: new RegExp(reference) });
      await row.waitFor();
      expect(await row.innerText()).toContain('QB-E2E-1');
      expect(await row.innerText()).toContain('Quarry Bank, plots 1–20');
      await expectAccessible(page);

      expect(failures).toEqual([]);
    } finally {
      await context.close();
    }
  });
});
