import type { Page, Response } from 'playwright-core';
import { freshPage, launchBrowser, type Browser } from '@/tests/e2e/support/browser';
import { CallPage, CallsListPage, UnitPage } from '@/tests/e2e/support/calls-pages';
import { DEMO, DEMO_PASSWORD, signedIn, unique, type ApiClient } from '@/tests/e2e/support/http';
import { AppShell, SignInPage, UsersAdminPage } from '@/tests/e2e/support/pages';
import { WizardPage } from '@/tests/e2e/support/wizard-page';

// The app in Chromium under its Content-Security-Policy: every screen loads and answers clicks with
// no script, style, font, image or connection refused, and no other site (nor the app itself) can
// show it in a frame.

let browser: Browser;
let tech: ApiClient;
let basementId: string;

beforeAll(async () => {
  browser = await launchBrowser();
  tech = await signedIn(DEMO.technician);
  const units = (await tech.get('/api/units')).json as { id: string; label: string }[];
  const basement = units.find((u) => u.label === 'Basement furnace');
  if (!basement) throw new Error('no demo unit "Basement furnace"');
  basementId = basement.id;
});

afterAll(async () => {
  await browser?.close();
});

interface Watched {
  page: Page;
  /** Every policy violation, from the page's `securitypolicyviolation` events and from the console. */
  violations: string[];
  /** Uncaught errors and console errors of any other kind. */
  errors: string[];
}

/** A fresh page that records every CSP violation and error from its first navigation on. */
async function watchedPage(): Promise<Watched> {
  const page = await freshPage(browser);
  const violations: string[] = [];
  const errors: string[] = [];
  await page.exposeFunction('__pgReportViolation', (line: string) => violations.push(line));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      const report = (window as unknown as { __pgReportViolation(line: string): void }).__pgReportViolation;
      report(`${e.effectiveDirective} refused ${e.blockedURI || 'inline code'} in ${e.sourceFile}:${e.lineNumber} ${e.sample}`);
    });
  });
  page.on('console', (message) => {
    // The app has no favicon; the browser asks for one anyway and logs the 404.
    if (new URL(message.location().url || 'about:blank').pathname === '/favicon.ico') return;
    const text = message.text();
    if (/Content Security Policy/i.test(text)) violations.push(`console: ${text}`);
    else if (message.type() === 'error') errors.push(`console error on ${page.url()}: ${text}`);
  });
  page.on('pageerror', (error) => errors.push(`page error on ${page.url()}: ${error.message}`));
  return { page, violations, errors };
}

/** The navigation's own answer carries the policy with a nonce and both framing refusals. */
function expectPolicy(response: Response | null, what: string) {
  expect(response, what).not.toBeNull();
  const headers = response!.headers();
  expect(headers['content-security-policy'], what).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
  expect(headers['content-security-policy'], what).toMatch(/frame-ancestors 'none'/);
  expect(headers['x-frame-options'], what).toBe('DENY');
}

function expectClean(w: Watched) {
  expect(w.violations).toEqual([]);
  expect(w.errors).toEqual([]);
}

describe('the app under its Content-Security-Policy', () => {
  it('a technician: sign-in, home, calls, a call, a diagnosis, units and a unit with its chart, with nothing refused', async () => {
    const w = await watchedPage();
    const { page } = w;
    const complaint = unique('No heat under the policy');
    const call = await tech.post('/api/calls', { unitId: basementId, complaint });
    expect(call.status, call.text).toBe(201);

    // Sign-in: the theme toggle runs (a client component), then the form signs in through fetch.
    expectPolicy(await page.goto('/sign-in'), '/sign-in');
    const signIn = new SignInPage(page);
    await signIn.email.waitFor();
    const dark = () => page.evaluate(() => document.documentElement.classList.contains('dark'));
    const before = await dark();
    await page.getByRole('button', { name: /^Use the (dark|light) theme$/ }).click();
    await expect.poll(dark).toBe(!before);
    await page.getByRole('button', { name: /^Use the (dark|light) theme$/ }).click();
    await expect.poll(dark).toBe(before);
    await signIn.fill(DEMO.technician, DEMO_PASSWORD);
    await page.waitForURL((url) => url.pathname === '/');
    const shell = new AppShell(page);
    await shell.heading.waitFor();
    expect((await shell.navLabels()).length).toBeGreaterThan(0);

    // The calls list filters as one types, and a link opens the call without a full load.
    const list = new CallsListPage(page);
    const listed = page.waitForResponse((r) => new URL(r.url()).pathname === '/calls' && r.request().isNavigationRequest());
    await list.open();
    expectPolicy(await listed, '/calls');
    await list.search.fill(complaint);
    await expect.poll(() => list.items.count()).toBe(1);
    await list.openCall(complaint);
    expect(page.url()).toMatch(new RegExp(`/calls/${call.json.id}$`));

    // The call page starts a diagnosis through a server action; the wizard saves a reading.
    const callPage = new CallPage(page);
    await callPage.heading.waitFor();
    await callPage.startDiagnosis.click();
    await page.waitForURL(/\/diagnoses\/[0-9a-f-]{36}$/);
    const wizard = new WizardPage(page);
    await wizard.heading.waitFor();
    const first = await wizard.title();
    // 120 V: the nominal North American supply, inside the default tree's normal line-voltage band (common practice, no source).
    await wizard.enterReading('120');
    await wizard.saveReading();
    await expect.poll(() => wizard.title()).not.toBe(first);
    await wizard.waitUntilSaved();
    expectPolicy(await page.reload(), 'the diagnosis page');
    await wizard.heading.waitFor();

    // The units list searches; the unit page draws its chart (SVG with inline styles).
    expectPolicy(await page.goto('/units'), '/units');
    await page.getByRole('searchbox', { name: 'Search' }).fill('Basement');
    await page
      .getByRole('link', { name: /Basement furnace/ })
      .first()
      .waitFor();
    const unit = new UnitPage(page);
    await unit.open(basementId);
    await unit.chart.first().waitFor();
    expect(await unit.chart.first().locator('path').count()).toBeGreaterThan(0);

    // The root layout's theme script runs before the first paint with the nonce.
    await page.evaluate(() => localStorage.setItem('pg-theme', 'dark'));
    expectPolicy(await page.reload(), 'the unit page');
    expect(await dark()).toBe(true);
    await page.evaluate(() => localStorage.setItem('pg-theme', 'light'));
    await page.reload();
    expect(await dark()).toBe(false);

    expectClean(w);
    await page.close();
  });

  it('an admin: the users page adds a user through its form, with nothing refused', async () => {
    const w = await watchedPage();
    const { page } = w;
    await new SignInPage(page).signIn(DEMO.admin, DEMO_PASSWORD);
    const admin = new UsersAdminPage(page);
    const listed = page.waitForResponse((r) => new URL(r.url()).pathname === '/admin/users' && r.request().isNavigationRequest());
    await admin.open();
    expectPolicy(await listed, '/admin/users');
    const email = `${unique('policy')}@demo.test`;
    await admin.addUser({ name: 'Policy Check', email, role: 'apprentice', password: 'long-enough-123' });
    await admin.row(email).waitFor();
    expectClean(w);
    await page.close();
  });

  it('refuses code the page did not bring: an inline handler and a javascript: link do not run, and are reported', async () => {
    // The check that the watch above can see a violation at all.
    const w = await watchedPage();
    const { page } = w;
    await page.goto('/sign-in');
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await page.evaluate(() => {
      document.body.insertAdjacentHTML(
        'beforeend',
        '<img src="/no-such-image.png" alt="" onerror="window.__pgHandlerRan = true"><a id="pg-js" href="javascript:window.__pgLinkRan = true">x</a>',
      );
    });
    await page.click('#pg-js');
    await expect.poll(() => w.violations.some((v) => v.startsWith('script-src-attr'))).toBe(true);
    await expect.poll(() => w.violations.filter((v) => v.startsWith('console:')).length).toBeGreaterThanOrEqual(2);
    expect(await page.evaluate(() => (window as unknown as { __pgHandlerRan?: boolean }).__pgHandlerRan)).toBeUndefined();
    expect(await page.evaluate(() => (window as unknown as { __pgLinkRan?: boolean }).__pgLinkRan)).toBeUndefined();
    await page.close();
  });

  it('cannot be framed, by another site or by itself', async () => {
    const w = await watchedPage();
    const { page } = w;
    await new SignInPage(page).signIn(DEMO.technician, DEMO_PASSWORD);
    const base = new URL(page.url()).origin;

    // A frame that loads can be read (the detection below tells the two apart).
    await page.evaluate(() => {
      const frame = Object.assign(document.createElement('iframe'), { id: 'pg-ok', srcdoc: '<h1>framed</h1>' });
      document.body.append(frame);
    });
    await expect
      .poll(() => page.evaluate(() => (document.getElementById('pg-ok') as HTMLIFrameElement).contentDocument?.body?.textContent ?? ''))
      .toBe('framed');

    // The same site: the signed-in calls page in a frame of the app.
    await page.evaluate(() => {
      const frame = Object.assign(document.createElement('iframe'), { id: 'pg-self', src: '/calls' });
      document.body.append(frame);
    });
    await expect.poll(() => w.violations.filter((v) => /frame-ancestors/.test(v)).length).toBeGreaterThan(0);
    const self = page.frames().find((f) => f !== page.mainFrame() && f.url() !== 'about:srcdoc');
    expect(self?.url()).not.toMatch(new RegExp(`^${base}`));
    expect(await page.evaluate(() => (document.getElementById('pg-self') as HTMLIFrameElement).contentDocument)).toBeNull();

    // A page that is not the app's, framing it while the browser holds the session cookie.
    const other = await browser.context.newPage();
    const otherViolations: string[] = [];
    other.on('console', (m) => (/frame-ancestors/.test(m.text()) ? otherViolations.push(m.text()) : undefined));
    await other.setContent(`<iframe id="pg-foreign" src="${base}/calls"></iframe>`);
    await expect.poll(() => otherViolations.length).toBeGreaterThan(0);
    const foreign = other.frames().find((f) => f !== other.mainFrame());
    expect(foreign?.url()).not.toMatch(new RegExp(`^${base}`));
    expect(await foreign?.getByRole('heading', { name: 'Service calls' }).count()).toBe(0);
    await other.close();
    await page.close();
  });
});
