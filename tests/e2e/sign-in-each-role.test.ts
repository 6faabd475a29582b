import { describe, expect, it } from 'vitest';
import { DEMO_ORGANISATIONS, DEMO_PASSWORD } from '../../seeds/01-demo';
import { homePathForRole } from '../../src/app/home-path';
import { expectAccessible, useJourney } from './harness';

const journey = useJourney();

const README_ACCOUNTS = ['contractor@demo.test', 'estimator@demo.test', 'contractor2@demo.test', 'merchant@demo.test', 'sales@demo.test', 'dispatch@demo.test', 'driver@demo.test', 'merchant2@demo.test'];

describe('each demo person signs in and lands on their role’s home', () => {
  const people = DEMO_ORGANISATIONS.flatMap((o) => o.people.map((p) => ({ ...p, firm: o.name })));

  for (const email of README_ACCOUNTS) {
    it(`${email} signs in with the demo password and sees their home`, async () => {
      const person = people.find((p) => p.email === email);
      expect(person, `${email} is seeded`).toBeDefined();
      const context = await journey.browser.newContext({ viewport: email.startsWith('driver') ? { width: 390, height: 844 } : { width: 1280, height: 800 } });
      const page = await context.newPage();
      try {
        await page.goto(`${journey.server.url}/`);
        await page.waitForURL(/\/sign-in/);
        await expectAccessible(page);
        await page.getByLabel('E-mail', { exact: true }).fill(email);
        await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
        await page.getByRole('button', { name: 'Sign in', exact: true }).click();
        await page.waitForURL(new RegExp(`${homePathForRole(person!.role)}$`));
        const home = page.getByTestId(`role-home-${person!.role}`);
        await home.waitFor();
        expect(await page.locator('body').innerText()).toContain(person!.firm);
        await expectAccessible(page);
        // An owner also runs the firm's team: its members, their roles and the invitation form.
        if (person!.role.endsWith('_owner')) {
          await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' }).click();
          await page.waitForURL(/\/team$/);
          await page.getByRole('form', { name: 'Invite someone' }).waitFor();
          await expectAccessible(page);
        }
      } finally {
        await context.close();
      }
    });
  }

  it('a wrong password keeps the person on the sign-in page with a message', async () => {
    const context = await journey.browser.newContext();
    const page = await context.newPage();
    // The refused sign-in is the point of this story; nothing else may log an error.
    journey.consoleProblems.expectRefusal('/api/auth/login', 401);
    try {
      await page.goto(`${journey.server.url}/sign-in`);
      await page.getByLabel('E-mail', { exact: true }).fill('sales@demo.test');
      await page.getByLabel('Password', { exact: true }).fill('not-the-password');
      await page.getByRole('button', { name: 'Sign in', exact: true }).click();
      await page.getByText(/e-mail or password is wrong/i).waitFor();
      expect(page.url()).toContain('/sign-in');
      await expectAccessible(page);
    } finally {
      await context.close();
    }
  });
});
