import type { Locator, Page } from 'playwright-core';

// Page objects: the tests speak in what a person does, the selectors live here.

export class SignInPage {
  constructor(readonly page: Page) {}

  get email(): Locator {
    return this.page.getByLabel('E-mail');
  }
  get password(): Locator {
    return this.page.getByLabel('Password');
  }
  get submit(): Locator {
    return this.page.getByRole('button', { name: 'Sign in' });
  }
  /** The form-level message (wrong password, rate limit). */
  get message(): Locator {
    return this.page.getByRole('alert');
  }

  async open(): Promise<void> {
    await this.page.goto('/sign-in');
    await this.page.getByRole('heading', { name: 'Sign in' }).waitFor();
  }

  async fill(email: string, password: string): Promise<void> {
    await this.email.fill(email);
    await this.password.fill(password);
    await this.submit.click();
  }

  /** Signs in and waits for the home page. */
  async signIn(email: string, password: string): Promise<AppShell> {
    await this.open();
    await this.fill(email, password);
    await this.page.waitForURL((url) => url.pathname === '/');
    const shell = new AppShell(this.page);
    await shell.heading.waitFor();
    return shell;
  }
}

export class AppShell {
  constructor(readonly page: Page) {}

  /** The main navigation that is visible at the current width (sidebar or top bar). */
  get nav(): Locator {
    return this.page.locator('nav[aria-label="Main"]:visible');
  }
  get heading(): Locator {
    return this.page.getByRole('heading', { level: 1 });
  }
  get alert(): Locator {
    return this.page.getByRole('main').getByRole('alert');
  }
  get signOutButton(): Locator {
    return this.page.getByRole('button', { name: 'Sign out' }).locator('visible=true');
  }

  async navLabels(): Promise<string[]> {
    await this.nav.first().waitFor();
    expectOne(await this.nav.count(), 'visible main navigation');
    return (await this.nav.getByRole('link').allInnerTexts()).map((t) => t.trim());
  }

  async navHrefs(): Promise<string[]> {
    return this.nav.getByRole('link').evaluateAll((links) => links.map((a) => new URL((a as HTMLAnchorElement).href).pathname));
  }

  async signOut(): Promise<void> {
    await this.signOutButton.first().click();
    await this.page.waitForURL((url) => url.pathname === '/sign-in');
  }
}

export class UsersAdminPage {
  constructor(readonly page: Page) {}

  get status(): Locator {
    return this.page.getByRole('main').getByRole('status');
  }
  get table(): Locator {
    return this.page.getByRole('table');
  }
  get addForm(): Locator {
    return this.page.locator('section[aria-labelledby="add-user"]');
  }

  async open(): Promise<void> {
    await this.page.goto('/admin/users');
    await this.page.getByRole('heading', { name: 'Users', level: 1 }).waitFor();
  }

  row(email: string): Locator {
    return this.table.locator('tbody tr').filter({ hasText: email });
  }

  async addUser(user: { name: string; email: string; role: string; password: string }): Promise<void> {
    const form = this.addForm;
    await form.getByLabel('Name').fill(user.name);
    await form.getByLabel('E-mail').fill(user.email);
    await form.getByLabel('Role').selectOption(user.role);
    await form.getByLabel('Starting password').fill(user.password);
    await form.getByRole('button', { name: 'Add user' }).click();
  }

  async changeRole(name: string, email: string, role: string): Promise<void> {
    await this.row(email).getByLabel(`Role of ${name}`).selectOption(role);
    await this.page
      .getByRole('dialog')
      .getByRole('button', { name: /^Make / })
      .click();
  }

  async toggleActive(name: string, email: string): Promise<void> {
    await this.row(email)
      .getByRole('button', { name: new RegExp(`^(Deactivate|Reactivate) ${name}$`) })
      .click();
    await this.page
      .getByRole('dialog')
      .getByRole('button', { name: /^(Deactivate|Reactivate)$/ })
      .click();
  }
}

function expectOne(count: number, what: string): void {
  if (count !== 1) throw new Error(`expected exactly one ${what}, found ${count}`);
}
