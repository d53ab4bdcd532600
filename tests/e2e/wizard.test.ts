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

// The wizard in Chromium, as the demo technician: paths of the built-in tree to their findings and
// on through the whole visit (repair, restore, verify) at the three screen sizes, every reading
// checked on its gauge, a reload mid-way, an undo, an "OL" entry and an escalation.

const tree: TreeVersion = { id: 'default', version: 2, graph: DEFAULT_TREE_GRAPH };
const SHOTS = process.env.WIZARD_SHOTS_DIR;

type Move = { step: string; text?: string; unit?: string; choice?: string; overRange?: true };

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
  // A unit of our own: two-rod, natural gas, 24 V control, induced draft.
  const site = await tech.post('/api/sites', { name: unique('Wizard test site'), address: '4 Gauge Row' });
  const unit = await tech.post('/api/units', {
    siteId: site.json.id,
    label: 'Wizard test furnace',
    ignition: 'two-rod',
    fuel: 'natural-gas',
    controlSupply: '24v',
    draft: 'induced',
    transformerVa: 40,
  });
  expect(unit.status, unit.text).toBe(201);
  unitId = unit.json.id;
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
    let value: number;
    let shown: { verdict: string | null; line: string };
    if (move.overRange) {
      shown = await wizard.enterOverRange();
      value = Number.POSITIVE_INFINITY;
    } else {
      shown = await wizard.enterReading(move.text!, move.unit);
      const parsed = parseReading(step.quantity, move.text!, move.unit ?? undefined);
      if (!parsed.ok) throw new Error(parsed.message);
      value = parsed.value;
    }
    const band = findBand(step.bands, value)!.band;
    expect(shown.verdict, `gauge verdict at ${step.id}`).toBe(band.verdict);
    expect(shown.line).toContain(band.label);
    await wizard.saveReading();
  } else if (step.kind === 'inspect') {
    const label = step.choices.find((c) => c.value === move.choice)!.label;
    await wizard.choose(label);
  } else if (step.kind === 'action') {
    const { disabledBeforeLast } = await wizard.tickAllAndConfirm();
    expect(disabledBeforeLast, `Confirm disabled before the last item at ${step.id}`).toBe(true);
  } else if (step.kind === 'finding') {
    await wizard.repairDone();
  }
}

const NO_SPARK_TO_CONTROL: Move[] = [
  { step: 'line-voltage', text: '120' },
  { step: 'trial-observe', choice: 'no-spark' },
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
  return view.json as {
    status: string;
    phase: string;
    finding: { id: string } | null;
    path: { stepId: string; band: string | null; text: string | null; overRange: boolean; auto: boolean }[];
  };
}

// The flame lights, then drops out: polarity and ground, the meter in series, a low signal, a dirty rod.
const DROPS_TO_DIRTY_ROD: Move[] = [
  { step: 'line-voltage', text: '120.4' },
  { step: 'trial-observe', choice: 'lights-drops' },
  { step: 'neutral-ground', text: '0.3' },
  { step: 'hot-ground', text: '120' },
  { step: 'lock-out--connect-microammeter' },
  { step: 'connect-microammeter' },
  { step: 're-energize--flame-signal' },
  { step: 'flame-signal', text: '0.5' },
  { step: 'carry-over', choice: 'carries' },
  { step: 'lock-out--rod-inspect' },
  { step: 'rod-inspect', choice: 'dirty' },
];
// The visit after the finding: the repair, the meter back in series, power back, the reading after the repair, the checks.
const DIRTY_ROD_VISIT: Move[] = [
  { step: 'f-dirty-flame-rod' },
  { step: 'reconnect--flame-signal--f-dirty-flame-rod' },
  { step: 're-energize--recheck--flame-signal--f-dirty-flame-rod' },
  { step: 'recheck--flame-signal--f-dirty-flame-rod', text: '4.2' },
  { step: 'verify--f-dirty-flame-rod' },
];

describe('the wizard', () => {
  it('walks to a blown control fuse, resuming after a reload and undoing one answer, locked out for the repair', async () => {
    const callId = await newCall();
    const { wizard, diagnosisId } = await startDiagnosis(callId);
    expect(await wizard.title()).toBe(titleOf('line-voltage'));
    await expect(wizard.energyBadge.getAttribute('data-energy')).resolves.toBe('energized');

    await play(wizard, { step: 'line-voltage', text: '120' });
    await play(wizard, { step: 'trial-observe', choice: 'no-spark' });
    // How the control is powered comes from the unit record: the next question is the transformer.
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
    expect((await serverView(diagnosisId)).path.map((a) => a.stepId)).toEqual(['line-voltage', 'trial-observe', 'control-supply']);

    await play(wizard, { step: 'transformer-secondary', text: '24.5' });
    await play(wizard, { step: 'fuse-output', text: '0' });
    // The fuse is changed with the power locked out: the procedure comes before the finding.
    await play(wizard, { step: 'lock-out--f-blown-fuse' });
    await expectFinding(wizard, 'f-blown-fuse');
    await expect(wizard.energyBadge.getAttribute('data-energy')).resolves.toBe('locked-out');

    const view = await serverView(diagnosisId);
    expect(view).toMatchObject({ status: 'found', phase: 'repair', finding: { id: 'f-blown-fuse' } });
    expect(view.path.map((a) => a.stepId)).toEqual([
      'line-voltage',
      'trial-observe',
      'control-supply',
      'transformer-secondary',
      'fuse-output',
      'lock-out--f-blown-fuse',
    ]);
  });

  for (const vp of ['tablet-landscape', 'tablet-portrait', 'phone'] as const) {
    it(`walks the dirty-rod visit from the first step through repair, restore and verify (${vp})`, async () => {
      await page.setViewportSize(VIEWPORTS[vp]);
      try {
        const callId = await newCall();
        const { wizard, diagnosisId } = await startDiagnosis(callId);
        for (const move of DROPS_TO_DIRTY_ROD) await play(wizard, move);
        await expectFinding(wizard, 'f-dirty-flame-rod');
        for (const move of DIRTY_ROD_VISIT) await play(wizard, move);
        await page.getByTestId('visit-done').waitFor();
        await wizard.waitUntilSaved();
        await expect(wizard.energyBadge.getAttribute('data-energy')).resolves.toBe('energized');
        await expect(page.getByTestId('energy-badge').first().getAttribute('data-gas')).resolves.toBe('on');
        const view = await serverView(diagnosisId);
        expect(view).toMatchObject({ status: 'verified', phase: 'done', finding: { id: 'f-dirty-flame-rod' } });
        expect(view.path.filter((a) => !a.auto).map((a) => a.stepId)).toEqual(
          [...DROPS_TO_DIRTY_ROD, ...DIRTY_ROD_VISIT].map((m) => m.step),
        );
        // The call page shows the visit, and the call can be closed.
        await page.goto(`/calls/${callId}`);
        await page.getByText(/repaired, power and gas restored, checks ticked/).waitFor();
      } finally {
        await page.setViewportSize(VIEWPORTS['tablet-landscape']);
      }
    });
  }

  it('takes "OL" from the keypad on the rollout switch and walks to the tripped rollout (tablet portrait)', async () => {
    await page.setViewportSize(VIEWPORTS['tablet-portrait']);
    try {
      const callId = await newCall();
      const { wizard, diagnosisId } = await startDiagnosis(callId);
      for (const move of [
        ...NO_SPARK_TO_CONTROL,
        { step: 'control-th-input', text: '0' },
        { step: 'high-limit-across', text: '0.2' },
        { step: 'lock-out--rollout-continuity' },
        { step: 'rollout-continuity', overRange: true as const },
        { step: 'gas-off--f-tripped-rollout' },
      ])
        await play(wizard, move);
      await expectFinding(wizard, 'f-tripped-rollout');
      const rollout = (await serverView(diagnosisId)).path.find((a) => a.stepId === 'rollout-continuity')!;
      expect(rollout).toMatchObject({ text: 'OL', overRange: true });
      // The call's readings list it too, as an open circuit.
      await page.goto(`/calls/${callId}`);
      await page.getByText('OL (open circuit)').first().waitFor();
    } finally {
      await page.setViewportSize(VIEWPORTS['tablet-landscape']);
    }
  });

  it('escalates from a step with a note, for the leads (phone)', async () => {
    await page.setViewportSize(VIEWPORTS.phone);
    try {
      const callId = await newCall();
      const { wizard, diagnosisId } = await startDiagnosis(callId);
      await play(wizard, { step: 'line-voltage', text: '120' });
      await wizard.waitForTitle(titleOf('trial-observe'));
      await wizard.waitUntilSaved();
      await wizard.escalate('The burners light only with the door off; none of the choices fits.');
      expect((await serverView(diagnosisId)).status).toBe('escalated');
      const lead = await signedIn(DEMO.lead);
      const listed = (await lead.get('/api/escalations')).json as { diagnosisId: string }[];
      expect(listed.map((e) => e.diagnosisId)).toContain(diagnosisId);
    } finally {
      await page.setViewportSize(VIEWPORTS['tablet-landscape']);
    }
  });

  it('reloads the view when another device answered first (409)', async () => {
    const callId = await newCall();
    const { wizard, diagnosisId } = await startDiagnosis(callId);
    // Another device answers first: this tablet's answer to the same step is then a 409 and the view reloads.
    await tech.post(`/api/diagnoses/${diagnosisId}/answers`, { clientId: crypto.randomUUID(), stepId: 'line-voltage', text: '120' });
    await play(wizard, { step: 'line-voltage', text: '118' });
    await page.getByTestId('notice').waitFor();
    await expect(page.getByTestId('notice').textContent()).resolves.toMatch(/reloaded/);
    await wizard.waitForTitle(titleOf('trial-observe'));
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
            step.kind === 'measure'
              ? m.overRange
                ? { overRange: true }
                : { text: m.text, unit: m.unit }
              : step.kind === 'inspect'
                ? { choice: m.choice }
                : { confirmed: true },
          );
        }
      };
      const toFlameSignal: Move[] = DROPS_TO_DIRTY_ROD.slice(0, 7);
      const callId = await newCall();
      // First diagnosis: a weak signal and an open ground path; the second reads a good signal, so
      // its finding "control not sensing" is contradicted by the open ground path of the first.
      const first = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(first, [
        ...toFlameSignal,
        { step: 'flame-signal', text: '0.5' },
        { step: 'carry-over', choice: 'carries' },
        { step: 'lock-out--rod-inspect' },
        { step: 'rod-inspect', choice: 'good' },
        { step: 'burner-surface', choice: 'clean' },
        { step: 'flame-lead-continuity', text: '0.2' },
        { step: 'ground-path', text: '50' },
      ]);
      const second = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(second, [...toFlameSignal, { step: 'flame-signal', text: '4' }]);
      const inspect = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(inspect, NO_SPARK_TO_CONTROL.slice(0, 4));
      const lockout = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(lockout, DROPS_TO_DIRTY_ROD.slice(0, 4));
      const measure = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(measure, NO_SPARK_TO_CONTROL.slice(0, 2));
      const repair = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(repair, DROPS_TO_DIRTY_ROD);
      const verify = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(verify, [...DROPS_TO_DIRTY_ROD, ...DIRTY_ROD_VISIT.slice(0, 4)]);
      const done = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(done, [...DROPS_TO_DIRTY_ROD, ...DIRTY_ROD_VISIT]);
      const ohms = (await tech.post(`/api/calls/${callId}/diagnoses`, { treeVersionId })).json.id as string;
      await walk(ohms, [
        ...NO_SPARK_TO_CONTROL,
        { step: 'control-th-input', text: '0' },
        { step: 'high-limit-across', text: '0.2' },
        { step: 'lock-out--rollout-continuity' },
      ]);

      const wizard = new WizardPage(page);
      const shots: [string, string, (() => Promise<void>)?][] = [
        ['measure', measure, async () => void (await wizard.enterReading('26.4'))],
        ['inspect', inspect],
        ['lockout', lockout, async () => void (await page.getByRole('checkbox').first().check())],
        ['finding-contradiction', second],
        ['repair', repair],
        ['verify', verify],
        ['done', done],
        ['ohms-ol', ohms, async () => void (await wizard.enterOverRange())],
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
