import type { Page } from 'playwright-core';
import { navFor, type Role } from '@/lib/roles';
import { freshPage, launchBrowser, screenshot, screenshotAll, VIEWPORTS, type Browser } from '@/tests/e2e/support/browser';
import { ApiClient, DEMO, DEMO_PASSWORD, SIGN_IN_REFUSED, unique } from '@/tests/e2e/support/http';
import { AppShell, SignInPage, UsersAdminPage } from '@/tests/e2e/support/pages';

const ACCOUNTS: { email: string; role: Role; firstName: string }[] = [
  { email: DEMO.apprentice, role: 'apprentice', firstName: 'Noor' },
  { email: DEMO.technician, role: 'technician', firstName: 'Dale' },
  { email: DEMO.lead, role: 'lead', firstName: 'Marguerite' },
  { email: DEMO.lead2, role: 'lead', firstName: 'Teodor' },
  { email: DEMO.trainer, role: 'trainer', firstName: 'Priya' },
  { email: DEMO.admin, role: 'admin', firstName: 'Gus' },
];

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
});

async function signInAs(email: string): Promise<{ page: Page; shell: AppShell }> {
  const page = await freshPage(browser);
  const shell = await new SignInPage(page).signIn(email, DEMO_PASSWORD);
  return { page, shell };
}

/** Every control a thumb must hit is at least 48 px tall. */
async function smallTargets(page: Page, selector: string): Promise<string[]> {
  return page.locator(selector).evaluateAll((els) =>
    els
      .filter((el) => (el as HTMLElement).offsetParent !== null && !el.closest('.sr-only'))
      .filter((el) => el.getBoundingClientRect().height < 48)
      .map((el) => `${el.tagName.toLowerCase()} "${(el.textContent ?? '').trim()}" ${Math.round(el.getBoundingClientRect().height)}px`),
  );
}

describe('sign-in page', () => {
  it('shows the form, with 48 px targets, in both themes at tablet and phone width', async () => {
    const page = await freshPage(browser);
    const signIn = new SignInPage(page);
    await signIn.open();
    await expectVisible(signIn.email);
    await expectVisible(signIn.password);
    await page.setViewportSize(VIEWPORTS.phone);
    expect(await smallTargets(page, 'button, input, a')).toEqual([]);
    await page.setViewportSize(VIEWPORTS.desktop);
    const files = await screenshotAll(page, 'sign-in');
    expect(files).toHaveLength(6);
    await page.close();
  });

  it('shows the refusal message for a wrong password and stays on the page', async () => {
    const page = await freshPage(browser);
    const signIn = new SignInPage(page);
    await signIn.open();
    await signIn.fill(DEMO.technician, 'not-the-password');
    await expectText(signIn.message, SIGN_IN_REFUSED);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    expect(await browser.context.cookies()).not.toContainEqual(expect.objectContaining({ name: 'pg_session' }));
    await screenshot(page, 'sign-in-wrong-password');
    await page.close();
  });

  it('shows field errors for an empty submit', async () => {
    const page = await freshPage(browser);
    const signIn = new SignInPage(page);
    await signIn.open();
    await signIn.submit.click();
    await expectText(page.locator('.field-error').first(), 'Enter a valid e-mail address.');
    await expectText(page.locator('.field-error').nth(1), 'Enter your password.');
    expect(await signIn.email.getAttribute('aria-invalid')).toBe('true');
    await page.close();
  });

  it('sends a visitor without a session to sign in', async () => {
    const page = await freshPage(browser);
    for (const path of ['/', '/admin/users', '/calls']) {
      await page.goto(path);
      expect(new URL(page.url()).pathname, path).toBe('/sign-in');
    }
    await page.close();
  });
});

describe('a damaged session cookie', () => {
  it('sends the visitor to sign in rather than to an error page, and sign-in still works', async () => {
    const page = await freshPage(browser);
    const url = new URL(process.env.E2E_BASE_URL!);
    await browser.context.addCookies([{ name: 'pg_session', value: 'left-over-junk', domain: url.hostname, path: '/' }]);
    const res = await page.goto('/');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    expect(res?.status()).toBe(200);
    const shell = await new SignInPage(page).signIn(DEMO.lead, DEMO_PASSWORD);
    await expectText(shell.heading, 'Good to see you, Marguerite');
    await page.close();
  });
});

describe.each(ACCOUNTS)('signed in as $email', ({ email, role, firstName }) => {
  it(`shows the ${role}'s home and exactly the ${role}'s navigation`, async () => {
    const { page, shell } = await signInAs(email);
    await expectText(shell.heading, `Good to see you, ${firstName}`);
    const expected = navFor(role);
    // 1280 wide: the sidebar carries the navigation.
    expect(await shell.navLabels()).toEqual(expected.map((item) => item.label));
    expect(await shell.navHrefs()).toEqual(expected.map((item) => item.href));
    expect(await page.locator('aside nav[aria-label="Main"]').isVisible()).toBe(true);
    expect(await shell.nav.getByRole('link', { name: 'Home' }).getAttribute('aria-current')).toBe('page');

    // A 1024 × 768 tablet: the side navigation gives its width to the page; the top bar carries it, in one row.
    await page.setViewportSize(VIEWPORTS['tablet-landscape']);
    expect(await page.locator('aside nav[aria-label="Main"]').isVisible()).toBe(false);
    expect(await page.locator('header nav[aria-label="Main"]').isVisible()).toBe(true);
    expect(await shell.navLabels()).toEqual(expected.map((item) => item.label));
    expect((await page.locator('header').boundingBox())!.height).toBeLessThan(80);
    expect(await smallTargets(page, 'a, button, select')).toEqual([]);

    // Phone width: the top bar carries the same navigation.
    await page.setViewportSize(VIEWPORTS.phone);
    expect(await shell.navLabels()).toEqual(expected.map((item) => item.label));
    expect(await page.locator('header nav[aria-label="Main"]').isVisible()).toBe(true);
    expect(await smallTargets(page, 'nav a, button')).toEqual([]);
    await page.setViewportSize(VIEWPORTS.desktop);

    if (email === DEMO.lead2) {
      await page.close();
      return;
    }
    const files = await screenshotAll(page, `home-${role}`);
    expect(files).toHaveLength(6);
    await page.close();
  });
});

describe('refusals and sign-out', () => {
  it('sends an apprentice who opens /admin/users home with a message', async () => {
    const { page, shell } = await signInAs(DEMO.apprentice);
    await page.goto('/admin/users');
    await page.waitForURL((url) => url.pathname === '/');
    expect(new URL(page.url()).searchParams.get('refused')).toBe('1');
    await expectText(shell.alert, 'That page is not open to your role');
    expect(await page.getByRole('heading', { name: 'Users', level: 1 }).count()).toBe(0);
    await page.goto('/admin/company');
    await page.waitForURL((url) => url.pathname === '/');
    await expectText(shell.alert, 'not open to your role');
    await page.close();
  });

  it('signs out to the sign-in page, and / then asks to sign in again', async () => {
    const { page, shell } = await signInAs(DEMO.trainer);
    await shell.signOut();
    await new SignInPage(page).email.waitFor();
    expect(await browser.context.cookies()).not.toContainEqual(expect.objectContaining({ name: 'pg_session' }));
    await page.goto('/');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });

  it('signs out from the phone top bar too', async () => {
    const page = await freshPage(browser);
    await page.setViewportSize(VIEWPORTS.phone);
    const shell = await new SignInPage(page).signIn(DEMO.technician, DEMO_PASSWORD);
    await shell.signOut();
    await page.goto('/');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.setViewportSize(VIEWPORTS.desktop);
    await page.close();
  });
});

describe('admin users page', () => {
  it('creates a user through the form, changes the role and deactivates through the table', async () => {
    const { page } = await signInAs(DEMO.admin);
    const users = new UsersAdminPage(page);
    await users.open();
    await expectVisible(users.row(DEMO.apprentice));
    await expectVisible(users.row(DEMO.admin));
    // The admin's own row offers no way to lock themselves out.
    expect(
      await users
        .row(DEMO.admin)
        .getByRole('button', { name: /^Deactivate/ })
        .count(),
    ).toBe(0);
    expect(await users.row(DEMO.admin).getByRole('combobox').isDisabled()).toBe(true);
    await screenshotAll(page, 'users');

    // Field errors for an empty form, and nothing is sent.
    await users.addForm.getByRole('button', { name: 'Add user' }).click();
    await expectText(users.addForm.locator('.field-error').first(), 'Enter a name.');

    const name = `Wren ${unique('Browser').slice(-8)}`;
    const email = `${unique('wren')}@browser-test.test`;
    const password = 'browser-password-1';
    await users.addUser({ name, email, role: 'apprentice', password });
    await expectText(users.status, `${name} was added.`);
    const row = users.row(email);
    await expectVisible(row);
    expect(await row.getByLabel(`Role of ${name}`).inputValue()).toBe('apprentice');

    // The new person can sign in; their session is watched while the admin changes them.
    const person = new ApiClient();
    expect((await person.signIn(email, password)).status).toBe(200);

    await users.changeRole(name, email, 'technician');
    await expectText(users.status, `${name} is now technician.`);
    await waitFor(
      async () => (await row.getByLabel(`Role of ${name}`).inputValue()) === 'technician',
      'the role select to show technician',
    );
    // A role change ends the person's sessions.
    expect((await person.get('/api/me')).status).toBe(401);
    expect((await person.signIn(email, password)).status).toBe(200);

    await users.toggleActive(name, email);
    await expectText(users.status, `${name} is deactivated and signed out.`);
    await expectText(row, 'Deactivated');
    expect((await person.get('/api/me')).status).toBe(401);
    expect((await new ApiClient().signIn(email, password)).status).toBe(401);

    // After a reload the table still says so (it came from the database, not the page's memory).
    await page.reload();
    await expectText(users.row(email), 'Deactivated');
    expect(await users.row(email).getByLabel(`Role of ${name}`).inputValue()).toBe('technician');
    await screenshot(page, 'users-after-changes');

    // A duplicate e-mail shows the server's message on the form.
    await users.addUser({ name: 'Twin', email, role: 'technician', password });
    await expectText(users.addForm.getByRole('alert').first(), 'A user with that e-mail address already exists.');
    await page.close();
  });
});

async function expectVisible(locator: import('playwright-core').Locator): Promise<void> {
  await locator.first().waitFor({ state: 'visible' });
  expect(await locator.first().isVisible()).toBe(true);
}

async function expectText(locator: import('playwright-core').Locator, text: string): Promise<void> {
  await waitFor(async () => ((await locator.first().textContent()) ?? '').includes(text), `"${text}"`);
  expect(await locator.first().textContent()).toContain(text);
}

async function waitFor(check: () => Promise<boolean>, what: string, timeoutMs = 15_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let last: unknown;
  while (Date.now() < deadline) {
    try {
      if (await check()) return;
    } catch (error) {
      last = error;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`timed out waiting for ${what}${last ? `: ${String(last)}` : ''}`);
}
