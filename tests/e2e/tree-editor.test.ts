import { mkdirSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { freshPage, launchBrowser, VIEWPORTS, type Browser } from '@/tests/e2e/support/browser';
import { DEMO, DEMO_PASSWORD, signedIn, type ApiClient } from '@/tests/e2e/support/http';
import { SignInPage } from '@/tests/e2e/support/pages';

// Tree authoring in Chromium at tablet size: a lead copies the default tree into a draft, moves a
// band boundary of the flame-signal step, adds an inspect step with two choices, sees the
// unconnected choice flagged, fixes it and submits; a second lead sees the diff, approves and
// publishes. Then two sessions edit one draft: the stale save shows both versions, nothing lost.

const SHOTS = '/tmp/shots-h8ui';
let browserA: Browser;
let browserB: Browser;
let a: Page;
let b: Page;
let lead: ApiClient;

async function shot(page: Page, name: string) {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

function panel(page: Page, stepId: string) {
  return page.getByRole('form', { name: `Step ${stepId}` });
}

async function openStep(page: Page, stepId: string) {
  await page.getByLabel('Go to a step').selectOption(stepId);
  await panel(page, stepId).waitFor();
}

/** Taps a step on the canvas itself (it must be in view). */
async function tapStep(page: Page, stepId: string) {
  await page.locator(`.react-flow__node[data-id="${stepId}"]`).click();
  await panel(page, stepId).waitFor();
}

async function waitSaved(page: Page) {
  await page
    .getByTestId('save-status')
    .filter({ hasText: /^Saved · revision \d+$/ })
    .waitFor({ timeout: 15_000 });
}

async function revisionShown(page: Page): Promise<number> {
  const text = await page.getByTestId('save-status').textContent();
  return Number(/revision (\d+)/.exec(text ?? '')?.[1]);
}

async function startDraftFromPublished(page: Page): Promise<string> {
  await page.goto('/trees');
  const card = page.locator('[data-tree="no-heat-dsi"]');
  await card.getByRole('button', { name: /^New draft from version \d+$/ }).click();
  await page.waitForURL(/\/trees\/versions\/[^/]+\/edit$/);
  await page.locator('.react-flow__node[data-id="flame-signal"]').waitFor();
  return /versions\/([^/]+)\/edit/.exec(page.url())![1];
}

beforeAll(async () => {
  lead = await signedIn(DEMO.lead);
  browserA = await launchBrowser();
  browserB = await launchBrowser();
  a = await freshPage(browserA);
  b = await freshPage(browserB);
  await a.setViewportSize(VIEWPORTS['tablet-landscape']);
  await b.setViewportSize(VIEWPORTS['tablet-landscape']);
  await new SignInPage(a).signIn(DEMO.lead, DEMO_PASSWORD);
  await new SignInPage(b).signIn(DEMO.lead2, DEMO_PASSWORD);
});

afterAll(async () => {
  // Leave the demo company on the built-in tree for the tests that run after this file.
  if (lead) {
    const lead2 = await signedIn(DEMO.lead2);
    const trees = (await lead.get('/api/trees')).json as { id: string; slug: string }[];
    const treeId = trees.find((t) => t.slug === 'no-heat-dsi')!.id;
    const draft = await lead.post(`/api/trees/${treeId}/drafts`, { fromBuiltin: true });
    expect(draft.status, draft.text).toBe(201);
    const id = draft.json.id as string;
    expect((await lead.post(`/api/tree-versions/${id}/submit`, {})).status).toBe(200);
    expect((await lead2.post(`/api/tree-versions/${id}/approve`, {})).status).toBe(200);
    expect((await lead2.post(`/api/tree-versions/${id}/publish`, {})).status).toBe(200);
  }
  await browserA?.close();
  await browserB?.close();
});

it('a lead edits a copy of the default tree, a second lead reviews the diff, approves and publishes', async () => {
  await a.goto('/trees');
  await a.locator('[data-tree="no-heat-dsi"]').waitFor();
  await shot(a, '00-tree-list');
  const versionId = await startDraftFromPublished(a);
  await shot(a, '01-editor-landscape');

  // Move the boundary between "Low flame signal" and "Good flame signal" from 2 to 1.5 µA.
  await tapStep(a, 'flame-signal');
  const boundary = panel(a, 'flame-signal').getByLabel('Boundary between band 3 and band 4');
  expect(await boundary.inputValue()).toBe('2');
  await boundary.fill('1.5');
  await boundary.press('Enter');
  await panel(a, 'flame-signal').getByText('Band 4: from 1.5 and up µA').waitFor();

  // An inspect step with two choices, the second left unconnected.
  await a.getByRole('button', { name: '+ Inspect' }).click();
  const inspect = panel(a, 'new-inspect');
  await inspect.getByLabel('Title', { exact: true }).fill('Is the burner flame steady and blue at the rod?');
  await inspect.getByLabel('Choice 1 leads to').selectOption('carry-over');
  const problems = a.getByTestId('problems');
  await problems.getByText('Choice "No" of "new-inspect" is not connected to a step').waitFor();
  expect(await a.getByRole('button', { name: 'Submit for review' }).isDisabled()).toBe(true);
  await shot(a, '02-unconnected-choice-flagged');

  // Fix it: connect the second choice, and lead to the new step from the low flame-signal band.
  await inspect.getByLabel('Choice 2 leads to').selectOption('f-control-not-sensing');
  await problems.getByText(/"new-inspect" cannot be reached/).click();
  await openStep(a, 'flame-signal');
  await panel(a, 'flame-signal').locator('[data-band="2"]').getByLabel('Leads to').selectOption('new-inspect');
  await a.getByText('No problems: this draft can be submitted for review.').waitFor();
  await waitSaved(a);
  await shot(a, '03-fixed-and-saved');

  await a.setViewportSize(VIEWPORTS['tablet-portrait']);
  await shot(a, '04-editor-portrait');
  await a.setViewportSize(VIEWPORTS['tablet-landscape']);

  await a.getByRole('button', { name: 'Submit for review' }).click();
  await a.waitForURL(/\/trees\/[^/]+\?submitted=/);
  await a.getByText('Submitted for review.').waitFor();

  // The author may not approve their own draft: the server refuses.
  const own = await lead.post(`/api/tree-versions/${versionId}/approve`, {});
  expect(own.status).toBe(403);

  // The second lead finds it on their home page, then sees the diff against the version it was copied from.
  await b.goto('/');
  const queue = b.locator('section[aria-labelledby="review-queue"]');
  await queue.locator(`a[href="/trees/versions/${versionId}"]`).click();
  await b.waitForURL(new RegExp(`/trees/versions/${versionId}$`));
  await b.getByRole('link', { name: 'What changed from the version it was copied from' }).click();
  const diff = b.getByTestId('diff-list');
  await diff.getByText('new-inspect', { exact: true }).first().waitFor();
  expect(await diff.textContent()).toContain('flame-signal');
  await b.locator('.react-flow__node[data-id="new-inspect"]').getByText('Added').waitFor();
  await shot(b, '05-diff');

  // A dry run of the submitted version in the wizard: nothing stored, the first step shown.
  await b.goto(`/trees/versions/${versionId}/dry-run`);
  await b.locator('[data-step-heading]').waitFor();
  await shot(b, '05b-dry-run');

  await b.goto(`/trees/versions/${versionId}`);
  await b.getByRole('button', { name: 'Approve' }).click();
  await b.getByRole('heading', { name: 'Approved: ready to publish' }).waitFor();
  await shot(b, '06-approved');
  await b.getByRole('button', { name: 'Publish' }).click();
  await b.getByText('Published', { exact: false }).first().waitFor();
  await b.getByRole('button', { name: 'Publish' }).waitFor({ state: 'detached' });

  const trees = (await lead.get('/api/trees')).json as { slug: string; published: { id: string } | null }[];
  expect(trees.find((t) => t.slug === 'no-heat-dsi')?.published?.id).toBe(versionId);
});

it('two sessions on one draft: the stale save shows both versions and the merge keeps both edits', async () => {
  const versionId = await startDraftFromPublished(a);
  await b.goto(`/trees/versions/${versionId}/edit`);
  await b.locator('.react-flow__node[data-id="flame-signal"]').waitFor();

  // A saves first.
  await openStep(a, 'flame-signal');
  await panel(a, 'flame-signal').getByLabel('Title', { exact: true }).fill('Flame signal, read in series');
  await waitSaved(a);
  expect(await revisionShown(a)).toBeGreaterThan(1);

  // B, still on the first revision, edits another step: its save is stale.
  await openStep(b, 'carry-over');
  await panel(b, 'carry-over').getByLabel('Title', { exact: true }).fill('Does the flame reach the sensing rod?');
  await b.getByRole('heading', { name: /Someone else saved this draft/ }).waitFor({ timeout: 15_000 });
  await shot(b, '07-conflict');
  expect(await b.locator('[data-conflict]').count()).toBe(2);
  // Per step: B's own carry-over, A's flame-signal.
  await b
    .locator('[data-conflict="flame-signal"]')
    .getByLabel(/Theirs/)
    .check();
  await b.getByRole('button', { name: 'Save the merge below' }).click();
  await waitSaved(b);

  const saved = (await lead.get(`/api/tree-versions/${versionId}`)).json as { graph: { steps: { id: string; title: string }[] } };
  const title = (id: string) => saved.graph.steps.find((s) => s.id === id)?.title;
  expect(title('flame-signal')).toBe('Flame signal, read in series');
  expect(title('carry-over')).toBe('Does the flame reach the sensing rod?');
  await shot(b, '08-merged');
});
