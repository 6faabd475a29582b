import type { Page } from 'playwright-core';
import { DEMO_PASSWORD } from '../../seeds/01-demo';

/** Signs a demo account in through the sign-in page and waits for its home page. */
export async function signInPage(page: Page, baseUrl: string, email: string, home: RegExp) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  await page.waitForURL(home);
}

/** JSON from the API as the signed-in page (its session cookie and CSRF token); a refusal throws with its body. */
export async function pageApi<T>(page: Page, method: 'GET' | 'POST', path: string, body?: unknown): Promise<T> {
  return page.evaluate(
    async ({ method, path, body }) => {
      const headers: Record<string, string> = { Accept: 'application/json' };
      if (method !== 'GET') {
        const csrf = (await (await fetch('/api/auth/csrf')).json()) as { token: string };
        headers['Content-Type'] = 'application/json';
        headers['X-CSRF-Token'] = csrf.token;
      }
      const response = await fetch(path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) });
      const json = (await response.json()) as unknown;
      if (!response.ok) throw new Error(`${method} ${path}: ${response.status} ${JSON.stringify(json)}`);
      return json;
    },
    { method, path, body },
  ) as Promise<T>;
}
