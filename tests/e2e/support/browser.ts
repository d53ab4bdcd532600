import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const SCREENSHOT_DIR = path.resolve('test-results', 'screenshots');

export const VIEWPORTS = {
  'tablet-landscape': { width: 1024, height: 768 },
  'tablet-portrait': { width: 768, height: 1024 },
  phone: { width: 390, height: 844 },
  desktop: { width: 1280, height: 800 },
} as const;
export type Theme = 'light' | 'dark';

export interface Browser {
  context: BrowserContext;
  close(): Promise<void>;
}

/** Debian's chromium through playwright-core, with a throwaway profile; no browser is downloaded. */
export async function launchBrowser(): Promise<Browser> {
  const profile = mkdtempSync(path.join(os.tmpdir(), 'pg-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    headless: true,
    viewport: VIEWPORTS.desktop,
    baseURL: process.env.E2E_BASE_URL,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  context.setDefaultTimeout(20_000);
  context.setDefaultNavigationTimeout(30_000);
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** A fresh page with no cookies, so that each identity starts signed out. */
export async function freshPage(browser: Browser): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  page.on('pageerror', (error) => console.error(`page error on ${page.url()}: ${error.message}`));
  return page;
}

/** Sets the theme the app reads from localStorage before its first paint, for every later load. */
export async function setTheme(page: Page, theme: Theme): Promise<void> {
  await page.evaluate((t) => localStorage.setItem('pg-theme', t), theme);
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/**
 * Screenshots of the current page at tablet (both ways) and phone width, in both themes. The
 * page is reloaded for each theme so the pre-paint theme script does the switching.
 */
export async function screenshotAll(page: Page, name: string): Promise<string[]> {
  const files: string[] = [];
  for (const theme of ['light', 'dark'] as const) {
    await setTheme(page, theme);
    for (const viewport of ['tablet-landscape', 'tablet-portrait', 'phone'] as const) {
      await page.setViewportSize(VIEWPORTS[viewport]);
      await settle(page, () => page.reload({ waitUntil: 'load' }));
      const dark = await page.evaluate(() => document.documentElement.classList.contains('dark'));
      if (dark !== (theme === 'dark')) throw new Error(`expected the ${theme} theme on ${page.url()}`);
      files.push(await screenshot(page, `${name}-${viewport}-${theme}`));
      const overflow = await horizontalOverflow(page);
      if (overflow) throw new Error(`${page.url()} at ${viewport} scrolls sideways: ${overflow}`);
    }
  }
  await setTheme(page, 'light');
  await page.setViewportSize(VIEWPORTS.desktop);
  await page.reload({ waitUntil: 'load' });
  return files;
}

/**
 * Runs `navigate`, then waits for the web fonts and a quiet moment. Not 'networkidle': after load,
 * Next prefetches every linked route, and pages linking to routes not built yet did not reach
 * 'networkidle' within 30 s.
 */
async function settle(page: Page, navigate: () => Promise<unknown>): Promise<void> {
  await navigate();
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  await page.waitForTimeout(700);
}

/**
 * Null when the page fits the viewport's width; otherwise the page width and the elements that
 * reach past the right edge (a page that scrolls sideways on a phone hides controls).
 */
export async function horizontalOverflow(page: Page): Promise<string | null> {
  return page.evaluate(() => {
    const width = window.innerWidth;
    const scrollWidth = document.documentElement.scrollWidth;
    if (scrollWidth <= width) return null;
    const culprits = [...document.body.querySelectorAll('*')]
      .filter((el) => el.getBoundingClientRect().right > width + 1)
      .slice(-5)
      .map(
        (el) =>
          `<${el.tagName.toLowerCase()} class="${el.getAttribute('class') ?? ''}"> right=${Math.round(el.getBoundingClientRect().right)}`,
      );
    return `page is ${scrollWidth}px wide in a ${width}px viewport; ${culprits.join('; ')}`;
  });
}
