import type { Locator, Page } from 'playwright-core';

// The wizard as a person uses it: read the step, enter a reading, pick, tick, confirm, undo.

export class WizardPage {
  constructor(readonly page: Page) {}

  get heading(): Locator {
    return this.page.locator('[data-step-heading]');
  }
  get readingInput(): Locator {
    return this.page.getByLabel('Reading', { exact: true });
  }
  get gaugeVerdict(): Locator {
    return this.page.getByTestId('gauge-verdict');
  }
  get syncStatus(): Locator {
    return this.page.getByTestId('sync-status');
  }
  get energyBadge(): Locator {
    return this.page.getByTestId('energy-badge').first();
  }
  get finding(): Locator {
    return this.page.getByTestId('finding');
  }
  get refusal(): Locator {
    return this.page.getByTestId('refusal');
  }

  async open(callId: string, diagnosisId: string): Promise<void> {
    await this.page.goto(`/calls/${callId}/diagnoses/${diagnosisId}`);
    await this.heading.waitFor();
  }

  async title(): Promise<string> {
    return (await this.heading.textContent())?.trim() ?? '';
  }

  async waitForTitle(title: string): Promise<void> {
    await this.page.locator('[data-step-heading]', { hasText: title }).waitFor();
  }

  /** Picks the unit, types with the on-screen keypad, and returns the gauge's verdict before saving. */
  async enterReading(text: string, unit?: string): Promise<{ verdict: string | null; line: string }> {
    if (unit)
      await this.page
        .getByRole('radiogroup', { name: 'Unit' })
        .getByRole('radio', { name: new RegExp(`^${escape(unit)} `) })
        .click();
    for (const ch of text) {
      const name = ch === ' ' ? 'Space' : ch === '.' ? 'Decimal point' : ch === '/' ? 'Fraction slash' : ch === '-' ? 'Minus' : ch;
      await this.page.getByRole('group', { name: 'Keypad' }).getByRole('button', { name, exact: true }).click();
    }
    await this.gaugeVerdict.waitFor();
    return { verdict: await this.gaugeVerdict.getAttribute('data-verdict'), line: ((await this.gaugeVerdict.textContent()) ?? '').trim() };
  }

  /** An ohms reading over range, with the keypad's OL key. */
  async enterOverRange(): Promise<{ verdict: string | null; line: string }> {
    await this.page.getByRole('group', { name: 'Keypad' }).getByRole('button', { name: 'OL, open circuit (over range)' }).click();
    await this.gaugeVerdict.waitFor();
    return { verdict: await this.gaugeVerdict.getAttribute('data-verdict'), line: ((await this.gaugeVerdict.textContent()) ?? '').trim() };
  }

  async repairDone(): Promise<void> {
    await this.page.getByTestId('repair-done').click();
  }

  async escalate(note: string): Promise<void> {
    await this.page.getByRole('button', { name: /None of these fits/ }).click();
    await this.page.getByLabel(/What you saw, or why the reading cannot be taken/).fill(note);
    await this.page.getByRole('button', { name: 'Send to the leads' }).click();
    await this.page.getByTestId('escalated').waitFor();
  }

  async saveReading(): Promise<void> {
    await this.page.getByRole('button', { name: 'Save reading' }).click();
  }

  async choose(label: string | RegExp): Promise<void> {
    await this.page.getByRole('radio', { name: label }).click();
    await this.page.getByRole('button', { name: 'Choose', exact: true }).click();
  }

  /** Ticks every item of an action step, checking Confirm stays disabled until the last. */
  async tickAllAndConfirm(): Promise<{ disabledBeforeLast: boolean }> {
    const boxes = this.page.getByRole('checkbox');
    const n = await boxes.count();
    const confirm = this.page.getByRole('button', { name: 'Confirm', exact: true });
    let disabledBeforeLast = true;
    for (let i = 0; i < n; i++) {
      if (i === n - 1) disabledBeforeLast = await confirm.isDisabled();
      await boxes.nth(i).check();
    }
    await confirm.click();
    return { disabledBeforeLast: n === 0 ? true : disabledBeforeLast };
  }

  async undoLast(): Promise<void> {
    await this.page.getByRole('button', { name: 'Undo last answer' }).click();
    await this.page.getByRole('button', { name: 'Undo it' }).click();
  }

  async waitUntilSaved(): Promise<void> {
    await this.page.locator('[data-testid="sync-status"][data-sync="saved"]').waitFor();
  }
}

function escape(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
