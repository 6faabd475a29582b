import { existsSync } from 'node:fs';
import { chromium, type Browser } from 'playwright-core';

const SYSTEM_NSS = ['/usr/lib/x86_64-linux-gnu/libnss3.so', '/usr/lib/aarch64-linux-gnu/libnss3.so', '/usr/lib64/libnss3.so'];

/**
 * Headless Chromium for the browser journeys: CHROMIUM_PATH when set (e.g. Debian's
 * /usr/bin/chromium), otherwise the build that npm ci brings in @sparticuz/chromium.
 */
export async function launchBrowser(): Promise<Browser> {
  const override = process.env.CHROMIUM_PATH;
  if (override) {
    return chromium.launch({
      executablePath: override,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    });
  }
  // Without the system's NSS libraries, the package uses the copies it ships for serverless hosts.
  if (!SYSTEM_NSS.some(existsSync)) process.env.AWS_EXECUTION_ENV ??= 'AWS_Lambda_nodejs20.x';
  const { default: packaged } = await import('@sparticuz/chromium');
  // Its serverless flags include --single-process, where closing one context ends the browser.
  const args = packaged.args.filter((a) => a !== '--single-process' && a !== '--no-zygote');
  return chromium.launch({ executablePath: await packaged.executablePath(), args, headless: true });
}
