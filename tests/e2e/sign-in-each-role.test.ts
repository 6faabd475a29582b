import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { DEMO_ORGANISATIONS, DEMO_PASSWORD } from '../../seeds/01-demo';
import { launchBrowser, watchConsole } from '../setup/browser';
import { startE2eServer, type E2eServer } from '../setup/e2e-server';

let server: E2eServer;
let browser: Browser;
let consoleProblems: ReturnType<typeof watchConsole>;
// No page a journey visits may log an error or throw (a failed request shows as a console error too).
afterEach(() => {
  expect(consoleProblems.take()).toEqual([]);
});

beforeAll(async () => {
  server = await startE2eServer();
  browser = await launchBrowser();
  consoleProblems = watchConsole(browser);
});
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

const HOMES: Record<string, string> = {
  contractor_owner: '/contractor',
  contractor_estimator: '/contractor',
  merchant_owner: '/desk',
  merchant_sales: '/desk',
  merchant_dispatcher: '/yard',
  driver: '/driver',
};

const README_ACCOUNTS = [
  'contractor@demo.test',
  'estimator@demo.test',
  'contractor2@demo.test',
  'merchant@demo.test',
  'sales@demo.test',
  'dispatch@demo.test',
  'driver@demo.test',
  'merchant2@demo.test',
];

describe('each demo person signs in and lands on their role’s home', () => {
  const people = DEMO_ORGANISATIONS.flatMap((o) => o.people.map((p) => ({ ...p, firm: o.name })));

  for (const email of README_ACCOUNTS) {
    it(`${email} signs in with the demo password and sees their home`, async () => {
      const person = people.find((p) => p.email === email);
      expect(person, `${email} is seeded`).toBeDefined();
      const context = await browser.newContext({ viewport: email.startsWith('driver') ? { width: 390, height: 844 } : { width: 1280, height: 800 } });
      const page = await context.newPage();
      try {
        await page.goto(`${server.url}/`);
        await page.waitForURL(/\/sign-in/);
        await page.getByLabel('E-mail', { exact: true }).fill(email);
        await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
        await page.getByRole('button', { name: 'Sign in', exact: true }).click();
        await page.waitForURL(new RegExp(`${HOMES[person!.role]}$`));
        const home = page.getByTestId(`role-home-${person!.role}`);
        await home.waitFor();
        expect(await page.locator('body').innerText()).toContain(person!.firm);
      } finally {
        await context.close();
      }
    });
  }

  it('a wrong password keeps the person on the sign-in page with a message', async () => {
    const page = await browser.newPage();
    // The refused sign-in is the point of this story; nothing else may log an error.
    consoleProblems.expectRefusal('/api/auth/login', 401);
    try {
      await page.goto(`${server.url}/sign-in`);
      await page.getByLabel('E-mail', { exact: true }).fill('sales@demo.test');
      await page.getByLabel('Password', { exact: true }).fill('not-the-password');
      await page.getByRole('button', { name: 'Sign in', exact: true }).click();
      await page.getByText(/e-mail or password is wrong/i).waitFor();
      expect(page.url()).toContain('/sign-in');
    } finally {
      await page.close();
    }
  });
});
