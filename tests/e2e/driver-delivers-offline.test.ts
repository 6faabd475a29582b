import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { pageApi } from '../setup/e2e-pages';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

// The demo seed sends the crane lorry's afternoon run of today out with Kofi Brennagh driving it: one
// ground drop for Brackenfold Roofworks (PO HB-P02), on the road and not yet delivered.
const REGISTRATION = 'RL-TY01';
const AFTERNOON = '12:30-16:30';
const RECEIVER = 'Halvard Ostrey';

interface DriverDayJson {
  runs: { id: number; time_window: string; lorry: { registration: string }; cautions: string[]; drops: { order_id: number; reference: string; status: string; site: { name: string } }[] }[];
}

/** A small real photo: a 96 × 64 JPEG of a ruddy roof-tile colour with a darker band, made here. */
async function sitePhoto(): Promise<Buffer> {
  const band = await sharp({ create: { width: 96, height: 16, channels: 3, background: { r: 92, g: 40, b: 28 } } })
    .png()
    .toBuffer();
  return sharp({ create: { width: 96, height: 64, channels: 3, background: { r: 168, g: 74, b: 52 } } })
    .composite([{ input: band, top: 24, left: 0 }])
    .jpeg({ quality: 80 })
    .toBuffer();
}

describe('the driver records a delivery without signal, and the contractor sees the proof', () => {
  // A long story with an accessibility check on every page it opens: each check takes seconds on a busy machine.
  it('on a phone the driver reads the cautions, opens the drop, records it offline with a signature and a photo, sees it wait, and sees it sent when the signal returns', { timeout: 300_000 }, async () => {
    const photo = await sitePhoto();
    expect((await sharp(photo).metadata()).format).toBe('jpeg');
    const phone = await journey.browser.newContext({
      viewport: { width: 390, height: 844 },
      deviceScaleFactor: 3,
      isMobile: true,
      hasTouch: true,
      geolocation: { latitude: 53.4871, longitude: -2.0858, accuracy: 12 },
      permissions: ['geolocation'],
    });
    const contractorContext = await journey.browser.newContext();
    try {
      const driver = await phone.newPage();
      await journey.signIn(driver, 'driver@demo.test', /\/driver$/);

      // Today's runs, from the firm's calendar: the afternoon crane run with its one drop, to deliver.
      const day = await pageApi<DriverDayJson>(driver, 'GET', '/api/driver/runs');
      const run = day.runs.find((r) => r.lorry.registration === REGISTRATION && r.time_window === AFTERNOON)!;
      expect(run.drops.map((d) => d.status)).toEqual(['on_the_road']);
      const drop = run.drops[0];
      const runSection = driver.getByRole('region', { name: `Run ${AFTERNOON} on ${REGISTRATION}` });
      await runSection.getByRole('heading', { name: `${AFTERNOON} · ${REGISTRATION}` }).waitFor();

      // The cautions once for the run, each line shown, then folded once read.
      const cautions = runSection.getByTestId('run-cautions');
      await cautions.waitFor();
      await expectAccessible(driver);
      expect(await cautions.getByRole('listitem').count()).toBe(run.cautions.length);
      expect(await cautions.innerText()).toMatch(/work at height/i);
      await cautions.getByRole('button', { name: 'I have read these' }).click();
      await runSection.getByText(/^Cautions read .*: show them again$/).waitFor();
      expect(await runSection.getByTestId('run-cautions').count()).toBe(0);
      // The acknowledgement reached the server while there was signal.
      await expect.poll(async () => (await pageApi<{ runs: { id: number; cautions_read_at: string | null }[] }>(driver, 'GET', '/api/driver/runs')).runs.find((r) => r.id === run.id)!.cautions_read_at).not.toBeNull();

      // The morning's crane lift (delivered already) keeps its landing plan: each face drawn with its stacks,
      // from the day alone (the driver may not read the estimate).
      const morning = day.runs.find((r) => r.lorry.registration === REGISTRATION && r.time_window !== AFTERNOON)!;
      const lift = driver
        .getByRole('region', { name: `Run ${morning.time_window} on ${REGISTRATION}` })
        .getByRole('article')
        .first();
      await lift.getByRole('button', { name: new RegExp(morning.drops[0].reference) }).click();
      const landing = lift.getByRole('region', { name: 'Roof landing plan' });
      const firstFace = landing.getByTestId('landing-face').first();
      await firstFace.getByText(/^Show the stacks on /).click();
      const faceDrawing = firstFace.getByTestId('face-drawing');
      await faceDrawing.waitFor();
      await expectAccessible(driver);
      expect(await faceDrawing.locator('[data-testid="stack"]').count()).toBeGreaterThan(0);
      expect(await faceDrawing.locator('[data-testid="loading-batten"]').count()).toBeGreaterThan(0);
      expect(await firstFace.innerText()).toMatch(/Stacks of 6 on every 2nd batten from the top, \d+ stacks on this face; load both slopes in step\./);

      // The drop opens: the site with its maps link, then the record button.
      const card = runSection.getByRole('article', { name: new RegExp(`Drop 1 of 1: ${drop.site.name}`) });
      const header = card.getByRole('button', { name: new RegExp(drop.reference) });
      if ((await header.getAttribute('aria-expanded')) !== 'true') await header.click();
      expect(await card.getByRole('link', { name: 'Open in maps' }).getAttribute('href')).toMatch(/^geo:0,0\?q=/);
      expect(await card.innerText()).toContain('To deliver');

      // No signal from here on.
      await phone.setOffline(true);
      await card.getByRole('button', { name: 'Record the delivery' }).click();
      const form = card.getByRole('form', { name: `Proof of delivery for ${drop.reference}` });
      await form.getByLabel('Taken by (name)').fill(RECEIVER);
      // The receiver signs with a finger: a stroke drawn across the signature box.
      const pad = form.getByRole('img', { name: /^Signature box/ });
      await pad.scrollIntoViewIfNeeded();
      const box = (await pad.boundingBox())!;
      await driver.mouse.move(box.x + box.width * 0.15, box.y + box.height * 0.6);
      await driver.mouse.down();
      for (let i = 1; i <= 12; i++) await driver.mouse.move(box.x + box.width * (0.15 + i * 0.055), box.y + box.height * (0.6 - 0.25 * Math.sin(i / 2)), { steps: 2 });
      await driver.mouse.up();
      await form.getByText('Signed. Clear it to sign again.').waitFor();
      await form.getByLabel('Take a photo').setInputFiles({ name: 'set-down.jpg', mimeType: 'image/jpeg', buffer: photo });
      await form.getByRole('img', { name: 'Taken on site, 1 of 1' }).waitFor();
      await form.getByLabel(/^Note/).fill('Set down on the hardstanding by the site cabin.');
      await form.getByText(/^Add where I am/).waitFor();
      await expectAccessible(driver);
      await form.getByRole('button', { name: 'Delivered' }).click();

      // Kept on the phone, waiting for signal.
      const waiting = driver.getByRole('region', { name: /^Waiting to send: 1$/ });
      await waiting.waitFor();
      expect(await waiting.innerText()).toContain('No signal: kept on this phone and sent when the signal returns.');
      expect(await waiting.getByTestId('waiting-entry').innerText()).toContain(`Delivery of ${drop.reference} at ${drop.site.name}, taken by ${RECEIVER} (signature, 1 photo)`);
      await card.getByText('Recorded, waiting to send', { exact: true }).waitFor();
      await expectAccessible(driver);
      // Nothing reached the server yet.
      const [{ count: before }] = await journey.server.db('delivery_proofs').where({ order_id: drop.order_id }).count({ count: '*' });
      expect(Number(before)).toBe(0);
      // The page's failed tries while offline are the story, not a fault: only those may be logged.
      const offlineLogs = journey.consoleProblems.take();
      expect(offlineLogs.filter((p) => !/ERR_INTERNET_DISCONNECTED|Failed to fetch|NetworkError/.test(p.text))).toEqual([]);

      // Signal again: it is sent by itself, once, and the drop shows delivered.
      await phone.setOffline(false);
      await driver.getByText('Everything recorded on this phone has been sent.').waitFor({ timeout: 30_000 });
      expect(await driver.getByRole('region', { name: /^Waiting to send/ }).count()).toBe(0);
      await card.getByText('Delivered', { exact: true }).first().waitFor();
      const proofs = await journey.server.db('delivery_proofs').where({ order_id: drop.order_id }).select('receiver_name');
      expect(proofs.map((p: { receiver_name: string }) => p.receiver_name)).toEqual([RECEIVER]);
      const files = await journey.server.db('delivery_files').join('delivery_proofs', 'delivery_proofs.id', 'delivery_files.proof_id').where('delivery_proofs.order_id', drop.order_id).select('kind', 'content_type');
      expect(files.map((f: { kind: string }) => f.kind).sort()).toEqual(['photo', 'signature']);

      // The contractor opens the order and sees who took it, the signature and the photo.
      const contractor = await contractorContext.newPage();
      await journey.signIn(contractor, 'estimator@demo.test', /\/contractor$/);
      await contractor.goto(`${journey.server.url}/orders/${drop.order_id}`);
      await contractor.getByRole('heading', { name: 'Proof of delivery' }).waitFor();
      await contractor.getByText(RECEIVER, { exact: true }).waitFor();
      await contractor.getByText('Set down on the hardstanding by the site cabin.').waitFor();
      const signature = contractor.getByRole('img', { name: `Signature of ${RECEIVER}` });
      await signature.waitFor();
      await expectAccessible(contractor);
      const thumbnail = contractor.getByRole('list', { name: 'Delivery photos' }).getByRole('img');
      expect(await thumbnail.count()).toBe(1);
      // Both pictures really load (a broken image has no natural width).
      await expect.poll(() => signature.evaluate(imageLoaded)).toBeGreaterThan(0);
      await expect.poll(() => thumbnail.evaluate(imageLoaded)).toBeGreaterThan(0);
      expect(await contractor.getByText(/^53\.4871\d, -2\.0858\d/).count()).toBe(1);
    } finally {
      await phone.close();
      await contractorContext.close();
    }
  });
});

/** Runs in the page: whether an <img> has loaded (a broken image has no natural width). Typed without the DOM library, which the Node-side tests do not load. */
function imageLoaded(img: unknown): number {
  const image = img as { complete: boolean; naturalWidth: number };
  return image.complete ? image.naturalWidth : 0;
}
