import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll } from 'vitest';
import {
  chromium,
  type Browser,
  type BrowserContext,
  type Page,
  type ViewportSize,
} from 'playwright-core';
import { startServer, type RunningServer } from './server';
import { TEST_PASSWORD } from './context';

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** Debian's Chromium, headless; playwright gives each launch a fresh, empty profile. */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS });
}

export const SCREENSHOT_DIR = path.resolve(
  import.meta.dirname,
  '..',
  '..',
  'test-results',
  'screens',
);

/**
 * Saves a screenshot under test-results/screens for a person to look at: the whole page,
 * or with `fullPage: false` only what shows without scrolling.
 */
export async function screenshot(page: Page, name: string, { fullPage = true } = {}) {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage });
}

/** Saves a screenshot of the first element matching `selector` under test-results/screens. */
export async function elementShot(page: Page, selector: string, name: string): Promise<void> {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page
    .locator(selector)
    .first()
    .screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`) });
}

/** Waits until the document editor's save state says "Saved <time>" (the autosave landed). */
export async function waitForSaved(page: Page): Promise<void> {
  await page
    .locator('[data-test="save-state"]')
    .filter({ hasText: /^\s*\S*\s*Saved/ })
    .waitFor();
}

/** How many pages the page prints on when printed to PDF on `format` paper, backgrounds on. */
export async function printedPageCount(page: Page, format: 'A4' | 'Letter'): Promise<number> {
  const pdf = await page.pdf({ format, printBackground: true });
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?!s)/g) ?? []).length;
}

/** The phone-sized window the browser tests use. */
export const PHONE: ViewportSize = { width: 375, height: 812 };

/** How the pages of `newPage` are opened. */
export interface PageOptions {
  /** The window size; 1280 × 900 unless told. */
  viewport?: ViewportSize;
  /** A touch screen on a mobile device (taps, `isMobile`). */
  touch?: boolean;
  /** The default timeout of the page's actions and waits, in ms; 15 s unless told. */
  timeout?: number;
}

/** What `useServerAndBrowser()` gives a test file; usable from its first test on. */
export interface ServerAndBrowser {
  /** The real server, started for this file. */
  readonly server: RunningServer;
  /** The server's address, e.g. `http://127.0.0.1:40123`. */
  readonly url: string;
  /** Debian's Chromium, launched for this file. */
  readonly browser: Browser;
  /**
   * Opens a page in a context of its own (its own cookies, so its own session) that logs
   * the page's uncaught errors; the context is closed after the file's tests.
   */
  newPage: (options?: PageOptions) => Promise<Page>;
  /** Signs `page` in on the sign-in form and waits for the account menu. */
  signIn: (page: Page, email: string, password?: string) => Promise<void>;
  /** `newPage(options)` signed in as `email` (with the demo password). */
  signedInPage: (email: string, options?: PageOptions) => Promise<Page>;
}

/**
 * Starts the real server (`startServer()`) and Chromium before the file's tests and
 * closes the pages it opened, the browser and the server after them. Call it at the top
 * of a test file; `pageDefaults` apply to every `newPage` of the file.
 */
export function useServerAndBrowser(pageDefaults: PageOptions = {}): ServerAndBrowser {
  let server: RunningServer | undefined;
  let browser: Browser | undefined;
  const contexts: BrowserContext[] = [];

  beforeAll(async () => {
    server = await startServer();
    browser = await launchBrowser();
  });
  afterAll(async () => {
    for (const c of contexts) await c.close().catch(() => {});
    await browser?.close();
    await server?.stop();
  });

  const started = <T>(value: T | undefined): T => {
    if (value === undefined) throw new Error('the server and browser start in beforeAll');
    return value;
  };

  const run: ServerAndBrowser = {
    get server() {
      return started(server);
    },
    get url() {
      return started(server).url;
    },
    get browser() {
      return started(browser);
    },
    async newPage(options = {}) {
      const {
        viewport = { width: 1280, height: 900 },
        touch = false,
        timeout = 15_000,
      } = { ...pageDefaults, ...options };
      const context = await run.browser.newContext({ viewport, hasTouch: touch, isMobile: touch });
      contexts.push(context);
      const page = await context.newPage();
      page.setDefaultTimeout(timeout);
      page.on('pageerror', (err) => console.error('page error:', err.message));
      return page;
    },
    async signIn(page, email, password = TEST_PASSWORD) {
      await page.goto(`${run.url}/sign-in`);
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password', { exact: true }).fill(password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByRole('button', { name: /^Account menu for/ }).waitFor();
    },
    async signedInPage(email, options) {
      const page = await run.newPage(options);
      await run.signIn(page, email);
      return page;
    },
  };
  return run;
}
