// "Sign out everywhere" in the app shell, in Chromium: asked first, 48 px targets at desktop and
// phone width in both themes, and once confirmed every session of the user ends (an API client
// signed in as the same person stands for their other device).
import type { Page } from 'playwright-core';
import { freshPage, horizontalOverflow, launchBrowser, screenshot, setTheme, VIEWPORTS, type Browser } from '@/tests/e2e/support/browser';
import { ApiClient, DEMO, signedIn, unique } from '@/tests/e2e/support/http';
import { SignInPage } from '@/tests/e2e/support/pages';

const PASSWORD = 'everywhere-password-1';
let browser: Browser;
let admin: ApiClient;

beforeAll(async () => {
  browser = await launchBrowser();
  admin = await signedIn(DEMO.admin);
});

afterAll(async () => {
  await browser?.close();
});

async function newUser(label: string): Promise<string> {
  const email = `${unique(label)}@sessions-e2e.test`;
  const res = await admin.post('/api/users', { email, name: `Everywhere ${label}`, role: 'technician', password: PASSWORD });
  if (res.status !== 201) throw new Error(`creating ${email} answered ${res.status}: ${res.text}`);
  return email;
}

const opener = (page: Page) => page.getByRole('button', { name: 'Sign out everywhere', exact: true }).locator('visible=true');
const dialog = (page: Page) => page.getByRole('alertdialog', { name: 'Sign out on every device?' }).locator('visible=true');

async function heights(page: Page, selector: string): Promise<number[]> {
  return page.locator(selector).evaluateAll((els) => els.map((el) => Math.round(el.getBoundingClientRect().height)));
}

describe('sign out everywhere in the shell', () => {
  it('asks first; Cancel ends nothing; at desktop and phone width, in both themes, targets are 48 px', async () => {
    const email = await newUser('shell-cancel');
    const otherDevice = await signedIn(email, PASSWORD);
    const page = await freshPage(browser);
    await new SignInPage(page).signIn(email, PASSWORD);

    for (const theme of ['light', 'dark'] as const) {
      await setTheme(page, theme);
      for (const viewport of ['desktop', 'phone'] as const) {
        await page.setViewportSize(VIEWPORTS[viewport]);
        await page.reload({ waitUntil: 'load' });
        expect(await page.evaluate(() => document.documentElement.classList.contains('dark'))).toBe(theme === 'dark');
        await expect(opener(page).count()).resolves.toBe(1);
        expect((await opener(page).boundingBox())!.height).toBeGreaterThanOrEqual(48);

        await opener(page).click();
        await dialog(page).waitFor();
        const buttons = await heights(page, '[role="alertdialog"]:visible button');
        expect(buttons).toHaveLength(2);
        for (const h of buttons) expect(h).toBeGreaterThanOrEqual(48);
        expect(await horizontalOverflow(page)).toBeNull();
        await screenshot(page, `sign-out-everywhere-${viewport}-${theme}`);

        await dialog(page).getByRole('button', { name: 'Cancel' }).click();
        await expect(dialog(page).count()).resolves.toBe(0);
      }
    }
    expect(new URL(page.url()).pathname).toBe('/');
    expect((await otherDevice.get('/api/me')).status).toBe(200);
    await setTheme(page, 'light');
    await page.close();
  });

  it('once confirmed, goes to sign-in and the same person’s other device is signed out too', async () => {
    const email = await newUser('shell-confirm');
    const otherDevice = await signedIn(email, PASSWORD);
    const bystander = await signedIn(DEMO.lead2);
    const page = await freshPage(browser);
    await new SignInPage(page).signIn(email, PASSWORD);
    await page.setViewportSize(VIEWPORTS.phone);

    await opener(page).click();
    await dialog(page).getByRole('button', { name: 'Sign out everywhere' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');

    expect((await otherDevice.get('/api/me')).status).toBe(401);
    expect((await bystander.get('/api/me')).status).toBe(200);
    // The browser's own cookie is cleared and the session behind it ended: the app sends it to sign in.
    await page.goto('/');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.setViewportSize(VIEWPORTS.desktop);
    await page.close();
  });
});
