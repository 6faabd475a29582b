import { expect, it } from 'vitest';
import { launchBrowser } from '../setup/browser';
import { expectAccessible } from './harness';

// The journeys' accessibility check must be able to fail: a picture with no text and a button with
// no name are critical under axe-core's WCAG 2 A rules (image-alt, button-name).
it('fails a page with a picture that has no text and a button that has no name, naming the rule', async () => {
  const browser = await launchBrowser();
  try {
    const page = await (await browser.newContext()).newPage();
    await page.setContent('<html lang="en"><head><title>Check</title></head><body><main><img src="data:image/png;base64,iVBORw0KGgo="><button></button></main></body></html>');
    await expect(expectAccessible(page)).rejects.toThrow(/critical (image-alt|button-name) on/);
    await page.setContent('<html lang="en"><head><title>Check</title></head><body><main><h1>Loads</h1><button>Send</button></main></body></html>');
    await expectAccessible(page);
  } finally {
    await browser.close();
  }
}, 120_000);
