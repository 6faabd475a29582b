import { existsSync } from 'node:fs';
import { chromium, type Browser, type BrowserServer, type LaunchOptions } from 'playwright-core';
import { inject } from 'vitest';

const SYSTEM_NSS = ['/usr/lib/x86_64-linux-gnu/libnss3.so', '/usr/lib/aarch64-linux-gnu/libnss3.so', '/usr/lib64/libnss3.so'];

declare module 'vitest' {
  export interface ProvidedContext {
    /** The run's one headless Chromium (tests/setup/e2e-global.ts), which each journey file connects to. */
    browserWsEndpoint?: string;
  }
}

/**
 * Headless Chromium for the browser journeys: CHROMIUM_PATH when set (e.g. Debian's
 * /usr/bin/chromium), otherwise the build that npm ci brings in @sparticuz/chromium.
 */
async function launchOptions(): Promise<LaunchOptions> {
  const override = process.env.CHROMIUM_PATH;
  if (override) {
    return {
      executablePath: override,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    };
  }
  // Without the system's NSS libraries, the package uses the copies it ships for serverless hosts.
  if (!SYSTEM_NSS.some(existsSync)) process.env.AWS_EXECUTION_ENV ??= 'AWS_Lambda_nodejs20.x';
  const { default: packaged } = await import('@sparticuz/chromium');
  // Its serverless flags include --single-process, where closing one context ends the browser.
  const args = packaged.args.filter((a) => a !== '--single-process' && a !== '--no-zygote');
  return { executablePath: await packaged.executablePath(), args, headless: true };
}

/**
 * The browser a journey file uses: a connection to the run's one Chromium where the project's global
 * set-up started it (closing the connection closes the file's contexts and leaves the browser to the
 * next file), or a Chromium of its own otherwise.
 */
export async function launchBrowser(): Promise<Browser> {
  const shared = inject('browserWsEndpoint');
  if (shared) return chromium.connect(shared);
  return chromium.launch(await launchOptions());
}

/** One Chromium for a whole run, started by a global set-up; files reach it through launchBrowser(). */
export async function launchBrowserServer(): Promise<BrowserServer> {
  return chromium.launchServer(await launchOptions());
}

/** A console error or uncaught exception on a page of a journey, with the address it happened at. */
export interface ConsoleProblem {
  url: string;
  text: string;
}

/**
 * Collects every console error and uncaught page exception on every page of every context the browser
 * opens from now on (browser.newPage opens its own context through newContext, so it is covered too).
 * A journey asserts `take()` is empty after each test: no page it visits may log an error.
 */
export function watchConsole(browser: Browser): { take: () => ConsoleProblem[]; expectRefusal: (path: string, status: number) => void } {
  let problems: ConsoleProblem[] = [];
  let expected: { path: string; status: number }[] = [];
  const newContext = browser.newContext.bind(browser);
  browser.newContext = async (options) => {
    const context = await newContext(options);
    context.on('page', (page) => {
      page.on('console', (msg) => {
        if (msg.type() === 'error') problems.push({ url: page.url(), text: `${msg.text()}${msg.location().url ? ` (${msg.location().url})` : ''}` });
      });
      page.on('pageerror', (err) => problems.push({ url: page.url(), text: `uncaught: ${err.message}` }));
    });
    return context;
  };
  return {
    /** The problems since the last take, less the one browser log line of each refusal the journey provoked on purpose. */
    take: () => {
      const out = problems.filter((p) => {
        const i = expected.findIndex((e) => p.text.includes(`status of ${e.status}`) && p.text.includes(e.path));
        if (i < 0) return true;
        expected.splice(i, 1);
        return false;
      });
      const missing = expected.map((e) => ({ url: '', text: `expected a refused request to ${e.path} (${e.status}) that never happened` }));
      problems = [];
      expected = [];
      return [...out, ...missing];
    },
    /**
     * A journey that provokes a refusal on purpose (a wrong password) says so: the browser logs every
     * 4xx answer as an error, and this one is part of the story, not a fault.
     */
    expectRefusal: (path: string, status: number) => {
      expected.push({ path, status });
    },
  };
}
