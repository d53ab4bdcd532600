import { mkdirSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { freshPage, horizontalOverflow, launchBrowser, VIEWPORTS, type Browser } from '@/tests/e2e/support/browser';
import { DEMO, DEMO_PASSWORD, signedIn } from '@/tests/e2e/support/http';
import { SignInPage } from '@/tests/e2e/support/pages';

// The usage pages in Chromium at tablet size, as a lead: the company's (findings by month, first-time
// fix, time to a finding) and the built-in tree's (per version). Screenshots go to /tmp/shots-h8s/.

const SHOTS = '/tmp/shots-h8s';
mkdirSync(SHOTS, { recursive: true });
const shot = (page: Page, name: string) => page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });

let browser: Browser;
let page: Page;

beforeAll(async () => {
  browser = await launchBrowser();
  page = await freshPage(browser);
  await page.setViewportSize(VIEWPORTS['tablet-portrait']);
  await new SignInPage(page).signIn(DEMO.lead, DEMO_PASSWORD);
});

afterAll(async () => {
  await browser?.close();
});

describe('tree usage pages', () => {
  it('shows the company figures', async () => {
    await page.goto('/trees/usage');
    await page.getByRole('heading', { name: 'How the trees are used' }).waitFor();
    await page.getByText('First-time fix', { exact: true }).waitFor();
    await page.getByRole('heading', { name: 'Most common findings by month' }).waitFor();
    expect(await horizontalOverflow(page)).toBeNull();
    await shot(page, 'company-usage');
  });

  it('shows each published version of the built-in tree', async () => {
    const trees = (await (await signedIn(DEMO.lead)).get('/api/trees')).json as { id: string; slug: string }[];
    const tree = trees.find((t) => t.slug === 'no-heat-dsi')!;
    await page.goto(`/trees/${tree.id}/usage`);
    await page.getByRole('heading', { name: /Where diagnoses go on/ }).waitFor();
    await page
      .getByRole('heading', { name: /Version \d+/ })
      .first()
      .waitFor();
    await page.getByText('Diagnoses run').first().waitFor();
    expect(await horizontalOverflow(page)).toBeNull();
    await shot(page, 'tree-usage');
  });

  it('sends a technician home', async () => {
    const tech = await freshPage(browser);
    await new SignInPage(tech).signIn(DEMO.technician, DEMO_PASSWORD);
    await tech.goto('/trees/usage');
    await tech.waitForURL((url) => url.pathname === '/');
    await tech.close();
  });
});
