import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { setTheme, VIEWPORTS } from '@/tests/e2e/support/browser';

// Page objects for the service calls, units and report screens.

export class CallsListPage {
  constructor(readonly page: Page) {}

  get heading(): Locator {
    return this.page.getByRole('heading', { name: 'Service calls', level: 1 });
  }
  get search(): Locator {
    return this.page.getByRole('searchbox', { name: 'Search' });
  }
  get statusFilter(): Locator {
    return this.page.getByLabel('Status', { exact: true });
  }
  get technicianFilter(): Locator {
    return this.page.getByLabel('Technician', { exact: true });
  }
  get count(): Locator {
    return this.page.getByRole('main').getByRole('status').first();
  }
  /** The visible representation of the calls: table rows on wide screens, cards below. */
  get items(): Locator {
    return this.page.locator('table tbody tr:visible, ul[aria-label="Service calls"]:visible > li');
  }

  async open(): Promise<void> {
    await this.page.goto('/calls');
    await this.heading.waitFor();
  }

  item(text: string): Locator {
    return this.items.filter({ hasText: text });
  }

  async openCall(text: string): Promise<void> {
    await this.item(text).getByRole('link').first().click();
    await this.page.waitForURL(/\/calls\/[0-9a-f-]{36}$/);
  }
}

export interface NewUnitFields {
  label: string;
  ignition: 'DSI, two-rod' | 'DSI, single-rod';
  fuel: 'Natural gas' | 'LP';
  supply: '24 V only' | 'Line-powered control';
  va: string;
  year?: string;
}

export class NewCallPage {
  constructor(readonly page: Page) {}

  get form(): Locator {
    return this.page.getByRole('main').locator('form');
  }
  get submit(): Locator {
    return this.page.getByRole('button', { name: 'Open the call' });
  }

  async open(unitId?: string): Promise<void> {
    await this.page.goto(unitId ? `/calls/new?unitId=${unitId}` : '/calls/new');
    await this.page.getByRole('heading', { name: 'New service call', level: 1 }).waitFor();
  }

  async addSite(site: { name: string; address: string; email?: string }): Promise<void> {
    await this.page.getByRole('button', { name: 'Add a new site' }).click();
    const group = this.page.getByRole('group', { name: 'New site' });
    await group.getByLabel('Site name').fill(site.name);
    await group.getByLabel('Address').fill(site.address);
    if (site.email) await group.getByLabel('Customer e-mail').fill(site.email);
    await group.getByRole('button', { name: 'Add site' }).click();
    await this.page
      .getByRole('radio', { name: new RegExp(site.name) })
      .and(this.page.locator(':checked'))
      .waitFor({ state: 'attached' });
  }

  async pickSite(name: string): Promise<void> {
    await this.page.getByRole('searchbox', { name: 'Find a site' }).fill(name);
    await this.page.getByRole('radio', { name: new RegExp(name) }).check({ force: true });
  }

  async addUnit(unit: NewUnitFields): Promise<void> {
    await this.page.getByRole('button', { name: 'Add a unit at this site' }).click();
    const group = this.page.getByRole('group', { name: 'New unit' });
    await group.getByLabel('Unit label').fill(unit.label);
    await group.getByRole('radio', { name: new RegExp(`^${unit.ignition}`) }).check({ force: true });
    await group.getByRole('radio', { name: new RegExp(`^${unit.fuel}`) }).check({ force: true });
    await group.getByRole('radio', { name: new RegExp(`^${unit.supply}`) }).check({ force: true });
    await group.getByLabel('Transformer rating (VA)').fill(unit.va);
    if (unit.year) await group.getByLabel('Install year').fill(unit.year);
    await group.getByRole('button', { name: 'Add unit' }).click();
    await this.page
      .getByRole('radio', { name: new RegExp(unit.label) })
      .and(this.page.locator(':checked'))
      .waitFor({ state: 'attached' });
  }

  async complain(text: string): Promise<void> {
    await this.page.getByRole('textbox', { name: 'Complaint' }).fill(text);
  }
}

export class CallPage {
  constructor(readonly page: Page) {}

  get heading(): Locator {
    return this.page.getByRole('heading', { level: 1 });
  }
  get status(): Locator {
    return this.page.getByRole('main').getByRole('alert').or(this.page.getByRole('main').getByRole('status'));
  }
  get startDiagnosis(): Locator {
    return this.page.getByRole('button', { name: 'Start diagnosis' });
  }
  get caution(): Locator {
    return this.page.getByRole('note', { name: 'WARNING' });
  }
  get readings(): Locator {
    return this.page.locator('section[aria-labelledby="readings-heading"]');
  }
  get repair(): Locator {
    return this.page.locator('form[aria-labelledby="repair-heading"]');
  }
  /** The form-level message after a close or refer attempt. */
  get finishMessage(): Locator {
    return this.page.locator('section[aria-labelledby="finish-heading"] [aria-live]').first();
  }

  async open(id: string): Promise<void> {
    await this.page.goto(`/calls/${id}`);
    await this.heading.waitFor();
  }

  async recordRepair(r: { notes: string; cycles: string; flame: string; tickAll: boolean }): Promise<void> {
    await this.repair.getByLabel('Repair notes').fill(r.notes);
    await this.repair.getByLabel('Heat cycles run').fill(r.cycles);
    await this.repair.getByLabel('Flame signal after repair').fill(r.flame);
    if (r.tickAll) for (const box of await this.repair.getByRole('checkbox').all()) await box.check();
    await this.repair.getByRole('button', { name: 'Save repair and verification' }).click();
  }

  /** Asks to close the call and confirms; a refusal stays in the dialog (dismiss it with `dismissDialog`). */
  async close(): Promise<void> {
    await this.page.getByRole('button', { name: 'Close call' }).click();
    await this.page.getByRole('dialog').getByRole('button', { name: 'Close the call' }).click();
  }

  async signOff(comment?: string): Promise<void> {
    await this.page.getByRole('button', { name: 'Sign off this finding' }).click();
    const dialog = this.page.getByRole('dialog');
    if (comment) await dialog.getByLabel('Comment (optional)').fill(comment);
    await dialog.getByRole('button', { name: 'Sign off' }).click();
  }

  async refer(reason: string): Promise<void> {
    await this.page.getByRole('button', { name: 'Refer' }).click();
    const dialog = this.page.getByRole('dialog');
    await dialog.getByLabel('Why refer it?').fill(reason);
    await dialog.getByRole('button', { name: 'Refer the call' }).click();
  }

  async dismissDialog(): Promise<void> {
    await this.page.keyboard.press('Escape');
    await this.page.getByRole('dialog').waitFor({ state: 'hidden' });
  }
}

export class ReportPage {
  constructor(readonly page: Page) {}

  get article(): Locator {
    return this.page.getByRole('article');
  }

  async open(callId: string): Promise<void> {
    await this.page.goto(`/calls/${callId}/report`);
    await this.page.getByRole('heading', { name: 'Service report', level: 1 }).waitFor();
  }
}

export class UnitPage {
  constructor(readonly page: Page) {}

  get chart(): Locator {
    return this.page.locator('svg.recharts-surface');
  }
  get summary(): Locator {
    return this.page.locator('#flame-summary');
  }

  async open(unitId: string): Promise<void> {
    await this.page.goto(`/units/${unitId}`);
    await this.page.getByRole('heading', { level: 1 }).waitFor();
  }
}

export const CALLS_SHOTS_DIR = process.env.CALLS_SHOTS_DIR || path.resolve('test-results', 'screenshots');

/** Screenshots at tablet (both ways) and phone width in both themes, reloading for each theme. */
export async function shootScreens(page: Page, name: string, prepare?: () => Promise<void>): Promise<string[]> {
  mkdirSync(CALLS_SHOTS_DIR, { recursive: true });
  const files: string[] = [];
  for (const theme of ['light', 'dark'] as const) {
    await setTheme(page, theme);
    for (const viewport of ['tablet-landscape', 'tablet-portrait', 'phone'] as const) {
      await page.setViewportSize(VIEWPORTS[viewport]);
      await page.reload({ waitUntil: 'networkidle' });
      // A state that a reload clears (field errors, a refusal) is brought back before each shot.
      if (prepare) await prepare();
      const file = path.join(CALLS_SHOTS_DIR, `${name}-${viewport}-${theme}.png`);
      await page.screenshot({ path: file, fullPage: true });
      files.push(file);
    }
  }
  await setTheme(page, 'light');
  await page.setViewportSize(VIEWPORTS.desktop);
  await page.reload({ waitUntil: 'networkidle' });
  return files;
}

/** Does the page scroll sideways at the current width? */
export async function scrollsSideways(page: Page): Promise<boolean> {
  return page.evaluate(() => document.documentElement.scrollWidth > document.documentElement.clientWidth + 1);
}
