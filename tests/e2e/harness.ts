import AxeBuilder from '@axe-core/playwright';
import type { Browser, BrowserContextOptions, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, expect } from 'vitest';
import { launchBrowser, watchConsole } from '../setup/browser';
import { signInPage } from '../setup/e2e-pages';
import { startE2eServer, type E2eServer } from '../setup/e2e-server';

/** What a journey file gets from `useJourney()`: the server, the browser and ways to sign a person in. */
export interface Journey {
  readonly server: E2eServer;
  readonly browser: Browser;
  readonly consoleProblems: ReturnType<typeof watchConsole>;
  /** Signs a demo account in on `page`, waits for its home page and checks that page's accessibility. */
  signIn(page: Page, email: string, home: RegExp): Promise<void>;
  /** A new page in a context of its own (its own cookies), signed in as `email` and on its home page. */
  signedInPage(email: string, home: RegExp, options?: BrowserContextOptions): Promise<Page>;
}

/**
 * The one preamble of every browser journey: call it once at the top of the file. It starts the app
 * on a fresh database and a headless Chromium before the tests, closes both after them, and fails a
 * test whose pages logged an error or threw (a failed request shows as a console error too).
 */
export function useJourney(): Journey {
  let server: E2eServer | undefined;
  let browser: Browser | undefined;
  let consoleProblems: ReturnType<typeof watchConsole> | undefined;
  const started = <T>(value: T | undefined, what: string): T => {
    if (value === undefined) throw new Error(`The journey's ${what} is not started: use it inside a test or hook`);
    return value;
  };

  beforeAll(async () => {
    server = await startE2eServer();
    browser = await launchBrowser();
    consoleProblems = watchConsole(browser);
  });
  afterEach(() => {
    expect(started(consoleProblems, 'console watch').take()).toEqual([]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.close();
  });

  const journey: Journey = {
    get server() {
      return started(server, 'server');
    },
    get browser() {
      return started(browser, 'browser');
    },
    get consoleProblems() {
      return started(consoleProblems, 'console watch');
    },
    async signIn(page, email, home) {
      await signInPage(page, journey.server.url, email, home);
      await expectAccessible(page);
    },
    async signedInPage(email, home, options) {
      const context = await journey.browser.newContext(options);
      const page = await context.newPage();
      await journey.signIn(page, email, home);
      return page;
    },
  };
  return journey;
}

/** The axe-core impacts a page may not have: a person with a screen reader or a keyboard is stopped by them. */
const BLOCKING = new Set(['serious', 'critical']);

/**
 * Runs axe-core (WCAG 2 A and AA rules) over the page as it is now and fails on any serious or
 * critical violation, naming the rule and the elements. Call it after each navigation of a journey.
 */
export async function expectAccessible(page: Page): Promise<void> {
  await page.waitForLoadState('load');
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  const blocking = results.violations.filter((v) => BLOCKING.has(v.impact ?? '')).map((v) => `${v.impact} ${v.id} on ${new URL(page.url()).pathname}: ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
  expect(blocking, `axe-core found on ${page.url()}:\n${blocking.join('\n')}`).toEqual([]);
}
