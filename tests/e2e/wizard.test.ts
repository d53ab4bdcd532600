import path from 'node:path';
import { mkdirSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { findBand } from '@/lib/bands';
import { DEFAULT_TREE_GRAPH } from '@/lib/trees/default-tree';
import type { TreeVersion } from '@/lib/trees/schema';
import { parseReading } from '@/lib/units';
import { getStep } from '@/machines/diagnosis-machine';
import { freshPage, launchBrowser, setTheme, VIEWPORTS, type Browser } from '@/tests/e2e/support/browser';
import { DEMO, DEMO_PASSWORD, signedIn, unique, type ApiClient } from '@/tests/e2e/support/http';
import { SignInPage } from '@/tests/e2e/support/pages';
import { WizardPage } from '@/tests/e2e/support/wizard-page';

// The wizard in Chromium at tablet size, as the demo technician: three paths of the default tree
// to three different findings, every reading checked on its gauge, a reload mid-way, an undo.

const tree: TreeVersion = { id: 'default', version: 1, graph: DEFAULT_TREE_GRAPH };
const SHOTS = process.env.WIZARD_SHOTS_DIR;

type Move = { step: string; text?: string; unit?: string; choice?: string };

let browser: Browser;
let tech: ApiClient;
let page: Page;
let treeVersionId: string;
let unitId: string;

beforeAll(async () => {
  browser = await launchBrowser();
  tech = await signedIn(DEMO.technician);
  const trees = (await tech.get('/api/trees')).json as { slug: string; published: { id: string } | null }[];
  treeVersionId = trees.find((t) => t.slug === 'no-heat-dsi' && t.published)!.published!.id;
  const units = (await tech.get('/api/units')).json as { id: string }[];
  unitId = units[0].id;
  page = await freshPage(browser);
  await page.setViewportSize(VIEWPORTS['tablet-landscape']);
  await new SignInPage(page).signIn(DEMO.technician, DEMO_PASSWORD);
});

afterAll(async () => {
  await browser?.close();
});

async function newCall(): Promise<string> {
  const created = await tech.post('/api/calls', { unitId, complaint: unique('No heat, control locks out') });
  expect(created.status).toBe(201);
  return created.json.id as string;
}

/** Starts from the call page's button when it is there, otherwise through the API. */
async function startDiagnosis(callId: string): Promise<{ wizard: WizardPage; diagnosisId: string }> {
  await page.goto(`/calls/${callId}`);
  const button = page.getByRole('button', { name: 'Start diagnosis' });
  let diagnosisId: string;
  if (await button.isVisible().catch(() => false)) {
    await button.click();
    await page.waitForURL(/\/diagnoses\/[0-9a-f-]{36}$/);
    diagnosisId = page.url().split('/').at(-1)!;
  } else {
    const started = await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId });
    expect(started.status).toBe(201);
    diagnosisId = started.json.id;
    await page.goto(`/calls/${callId}/diagnoses/${diagnosisId}`);
  }
  const wizard = new WizardPage(page);
  await wizard.heading.waitFor();
  return { wizard, diagnosisId };
}

function titleOf(stepId: string): string {
  return getStep(tree, stepId)!.title;
}

/** Answers one step through the UI; for a reading, checks the gauge shows the band the tree gives it. */
async function play(wizard: WizardPage, move: Move) {
  await wizard.waitForTitle(titleOf(move.step));
  const step = getStep(tree, move.step)!;
  if (step.kind === 'measure') {
    const shown = await wizard.enterReading(move.text!, move.unit);
    const parsed = parseReading(step.quantity, move.text!, move.unit ?? undefined);
    if (!parsed.ok) throw new Error(parsed.message);
    const band = findBand(step.bands, parsed.value)!.band;
    expect(shown.verdict, `gauge verdict at ${step.id}`).toBe(band.verdict);
    expect(shown.line).toContain(band.label);
    await wizard.saveReading();
  } else if (step.kind === 'inspect') {
    const label = step.choices.find((c) => c.value === move.choice)!.label;
    await wizard.choose(label);
  } else if (step.kind === 'action') {
    const { disabledBeforeLast } = await wizard.tickAllAndConfirm();
    expect(disabledBeforeLast, `Confirm disabled before the last item at ${step.id}`).toBe(true);
  }
}

const HEALTHY_TO_CONTROL: Move[] = [
  { step: 'line-voltage', text: '120' },
  { step: 'control-supply', choice: 'low-voltage-only' },
  { step: 'transformer-secondary', text: '24.5' },
  { step: 'fuse-output', text: '24' },
  { step: 'thermostat-call', choice: 'calling' },
  { step: 'w-voltage', text: '24' },
];

async function expectFinding(wizard: WizardPage, findingId: string) {
  await wizard.finding.waitFor();
  await wizard.waitForTitle(titleOf(findingId));
  await wizard.waitUntilSaved();
}

async function serverView(diagnosisId: string) {
  const view = await tech.get(`/api/diagnoses/${diagnosisId}`);
  expect(view.status).toBe(200);
  return view.json as { status: string; finding: { id: string } | null; path: { stepId: string; band: string | null }[] };
}

// From the control's thermostat input to the meter in series, with every check passing (the
// spark gap typed as a fraction with the inch picked).
const CONTROL_TO_FLAME_SIGNAL: Move[] = [
  { step: 'control-th-input', text: '24' },
  { step: 'spark-observe', choice: 'at-gap' },
  { step: 'lock-out--spark-gap' },
  { step: 'spark-gap', text: '1/8', unit: 'in' },
  { step: 'rod-condition', choice: 'good' },
  { step: 're-energize--valve-voltage' },
  { step: 'valve-voltage', text: '24' },
  { step: 'connect-manometer' },
  { step: 'fuel-type', choice: 'natural-gas' },
  { step: 'inlet-pressure', text: '7' },
  { step: 'manifold-pressure', text: '3.5' },
  { step: 'burners-light', choice: 'light' },
  { step: 'carry-over', choice: 'carries' },
  { step: 'lock-out--connect-microammeter' },
  { step: 'connect-microammeter' },
  { step: 're-energize--flame-signal' },
];

describe('the wizard', () => {
  it('walks to a blown control fuse, resuming after a reload and undoing one answer', async () => {
    const callId = await newCall();
    const { wizard, diagnosisId } = await startDiagnosis(callId);
    expect(await wizard.title()).toBe(titleOf('line-voltage'));
    await expect(wizard.energyBadge.getAttribute('data-energy')).resolves.toBe('energized');

    await play(wizard, { step: 'line-voltage', text: '120' });
    await play(wizard, { step: 'control-supply', choice: 'low-voltage-only' });
    await wizard.waitForTitle(titleOf('transformer-secondary'));
    await wizard.waitUntilSaved();

    // A reload resumes at the same step, from the server's path.
    await page.reload();
    await wizard.heading.waitFor();
    expect(await wizard.title()).toBe(titleOf('transformer-secondary'));

    await play(wizard, { step: 'transformer-secondary', text: '20' });
    await wizard.waitForTitle(titleOf('fuse-output'));
    await wizard.waitUntilSaved();

    // Undo the last answer: back at the transformer, the reading asked again.
    await wizard.undoLast();
    await wizard.waitForTitle(titleOf('transformer-secondary'));
    await wizard.waitUntilSaved();
    expect((await serverView(diagnosisId)).path.map((a) => a.stepId)).toEqual(['line-voltage', 'control-supply']);

    await play(wizard, { step: 'transformer-secondary', text: '24.5' });
    await play(wizard, { step: 'fuse-output', text: '0' });
    await expectFinding(wizard, 'f-blown-fuse');
    await expect(page.getByRole('link', { name: /go to the call/ }).getAttribute('href')).resolves.toBe(`/calls/${callId}`);

    const view = await serverView(diagnosisId);
    expect(view.status).toBe('found');
    expect(view.finding?.id).toBe('f-blown-fuse');
    expect(view.path.map((a) => a.stepId)).toEqual(['line-voltage', 'control-supply', 'transformer-secondary', 'fuse-output']);
  });

  it('walks to an open high limit', async () => {
    const callId = await newCall();
    const { wizard, diagnosisId } = await startDiagnosis(callId);
    for (const move of HEALTHY_TO_CONTROL) await play(wizard, move);
    await play(wizard, { step: 'control-th-input', text: '0' });
    await play(wizard, { step: 'high-limit-across', text: '24' });
    await expectFinding(wizard, 'f-open-high-limit');
    expect((await serverView(diagnosisId)).finding?.id).toBe('f-open-high-limit');
  });

  it('walks through lock-out and re-energize procedures to a dirty flame rod', async () => {
    const callId = await newCall();
    const { wizard, diagnosisId } = await startDiagnosis(callId);
    for (const move of HEALTHY_TO_CONTROL) await play(wizard, move);
    const moves: Move[] = [
      ...CONTROL_TO_FLAME_SIGNAL,
      { step: 'flame-signal', text: '0.5' },
      { step: 'lock-out--rod-inspect' },
      { step: 'rod-inspect', choice: 'dirty' },
    ];
    for (const move of moves) {
      await play(wizard, move);
      if (move.step === 'lock-out--spark-gap') {
        await wizard.waitForTitle(titleOf('spark-gap'));
        await expect(wizard.energyBadge.getAttribute('data-energy')).resolves.toBe('locked-out');
      }
    }
    await expectFinding(wizard, 'f-dirty-flame-rod');
    const view = await serverView(diagnosisId);
    expect(view.finding?.id).toBe('f-dirty-flame-rod');
    expect(view.path.map((a) => a.stepId)).toEqual([...HEALTHY_TO_CONTROL, ...moves].map((m) => m.step));
  });

  it('reloads the view when another device answered first (409)', async () => {
    const callId = await newCall();
    const { wizard, diagnosisId } = await startDiagnosis(callId);
    // Another device answers first: this tablet's answer to the same step is then a 409 and the view reloads.
    await tech.post(`/api/diagnoses/${diagnosisId}/answers`, { clientId: crypto.randomUUID(), stepId: 'line-voltage', text: '120' });
    await play(wizard, { step: 'line-voltage', text: '118' });
    await page.getByTestId('notice').waitFor();
    await expect(page.getByTestId('notice').textContent()).resolves.toMatch(/reloaded/);
    await wizard.waitForTitle(titleOf('control-supply'));
    expect((await serverView(diagnosisId)).path).toHaveLength(1);
  });

  it.runIf(Boolean(SHOTS))(
    'takes screenshots of the wizard screens',
    async () => {
      mkdirSync(SHOTS!, { recursive: true });
      const answer = async (diagnosisId: string, stepId: string, body: Record<string, unknown>) => {
        const res = await tech.post(`/api/diagnoses/${diagnosisId}/answers`, { clientId: crypto.randomUUID(), stepId, ...body });
        expect(res.status, `${stepId}: ${res.text}`).toBe(200);
      };
      const walk = async (diagnosisId: string, moves: Move[]) => {
        for (const m of moves) {
          const step = getStep(tree, m.step)!;
          await answer(
            diagnosisId,
            m.step,
            step.kind === 'measure' ? { text: m.text, unit: m.unit } : step.kind === 'inspect' ? { choice: m.choice } : { confirmed: true },
          );
        }
      };
      const toFlameSignal: Move[] = [...HEALTHY_TO_CONTROL, ...CONTROL_TO_FLAME_SIGNAL];
      const callId = await newCall();
      // First diagnosis: a weak signal and an open ground path; the second reads a good signal, so
      // its finding "control not sensing" is contradicted by the open ground path of the first.
      const first = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(first, [
        ...toFlameSignal,
        { step: 'flame-signal', text: '0.5' },
        { step: 'lock-out--rod-inspect' },
        { step: 'rod-inspect', choice: 'good' },
        { step: 'burner-surface', choice: 'clean' },
        { step: 'ground-path', text: '50' },
      ]);
      const second = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(second, [...toFlameSignal, { step: 'flame-signal', text: '4' }]);
      const inspect = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(inspect, HEALTHY_TO_CONTROL.slice(0, 4));
      const lockout = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(lockout, [...HEALTHY_TO_CONTROL, { step: 'control-th-input', text: '24' }, { step: 'spark-observe', choice: 'at-gap' }]);
      const measure = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(measure, HEALTHY_TO_CONTROL.slice(0, 2));

      const wizard = new WizardPage(page);
      const shots: [string, string, (() => Promise<void>)?][] = [
        ['measure', measure, async () => void (await wizard.enterReading('26.4'))],
        ['inspect', inspect],
        ['lockout', lockout, async () => void (await page.getByRole('checkbox').first().check())],
        ['finding-contradiction', second],
      ];
      for (const [name, id, prepare] of shots) {
        for (const theme of ['light', 'dark'] as const) {
          await setTheme(page, theme);
          for (const vp of ['tablet-landscape', 'tablet-portrait', 'phone'] as const) {
            await page.setViewportSize(VIEWPORTS[vp]);
            await wizard.open(callId, id);
            if (name === 'finding-contradiction') await page.getByTestId('contradictions').waitFor();
            if (prepare) await prepare();
            await page.screenshot({ path: path.join(SHOTS!, `${name}-${vp}-${theme}.png`), fullPage: true });
          }
        }
      }
      await setTheme(page, 'light');
      await page.setViewportSize(VIEWPORTS['tablet-landscape']);
    },
    300_000,
  );
});
