import { readAnswer } from '@/lib/answers';
import { AppError } from '@/lib/errors';
import { stepSchema, type Step } from '@/lib/trees/schema';

// Steps of our own (demo bands); the rule under test is how an answer is read, not the bands.
const ohms: Step = stepSchema.parse({
  id: 'limit-ohms',
  kind: 'measure',
  title: 'High limit, ohms',
  energy: { electric: 'off', gas: 'any' },
  quantity: 'ohm',
  points: ['limit in', 'limit out'],
  bands: [
    { to: 1, label: 'Closed', verdict: 'within', outcome: 'next' },
    { from: 1, label: 'Open', verdict: 'above', outcome: 'f-open' },
  ],
});
const microamps: Step = stepSchema.parse({
  id: 'flame-signal',
  kind: 'measure',
  title: 'Flame signal',
  energy: { electric: 'on', gas: 'on' },
  quantity: 'udc',
  points: ['rod lead', 'control'],
  bands: [
    { to: 0, label: 'Negative', verdict: 'below', askAgain: 'The leads are reversed: swap them and read again.' },
    { from: 0, to: 2, label: 'Low', verdict: 'below', outcome: 'f-low' },
    { from: 2, label: 'Good', verdict: 'within', outcome: 'next' },
  ],
});
const light: Step = stepSchema.parse({
  id: 'status-light',
  kind: 'inspect',
  title: 'Status light',
  energy: { electric: 'on', gas: 'any' },
  choices: [
    { value: 'steady', label: 'Steady', outcome: 'a' },
    { value: 'flashing', label: 'Flashing', outcome: 'b' },
  ],
  note: { label: 'What the light shows', required: true },
});

function refusal(fn: () => unknown): AppError {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError) return e;
    throw e;
  }
  throw new Error('expected a refusal');
}

describe('reading an answer (one rule for a diagnosis, a practice walk and a dry run)', () => {
  it('reads OL on an ohms step as an open circuit, in the band open above', () => {
    const read = readAnswer(ohms, { overRange: true });
    expect(read.fields).toMatchObject({ text: 'OL', value: null, overRange: true, bandLabel: 'Open', verdict: 'above' });
    expect(read.machine).toEqual({ overRange: true });
    expect(read.verdict?.outcome).toBe('f-open');
  });

  it('refuses OL where the quantity has no over range, and a reading that asks again, naming the field', () => {
    const ol = refusal(() => readAnswer(microamps, { overRange: true }));
    expect(ol.code).toBe('bad_request');
    expect(ol.message).toMatch(/only for a resistance reading/);
    // A negative DC reading means reversed leads (the at-the-unit issue; common practice, no source).
    const reversed = refusal(() => readAnswer(microamps, { text: '-3.1', unit: 'µA' }));
    expect(reversed.message).toBe('The leads are reversed: swap them and read again.');
  });

  it('keeps a reading in the unit it was entered and judges it in the canonical unit', () => {
    const read = readAnswer(microamps, { text: '4.2', unit: 'µA' });
    expect(read.fields).toMatchObject({ value: 4.2, unit: 'µA', quantity: 'udc', bandLabel: 'Good', verdict: 'within' });
    expect(read.verdict).toMatchObject({ band: 'Good', outcome: 'next' });
  });

  it('needs a choice of the step and the note it asks for', () => {
    expect(refusal(() => readAnswer(light, { choice: 'off', note: 'x' })).message).toBe('Choose one of: steady, flashing.');
    expect(refusal(() => readAnswer(light, { choice: 'flashing', note: '  ' })).message).toBe('What the light shows: write what you saw.');
    expect(readAnswer(light, { choice: 'flashing', note: '3 flashes' }).fields).toMatchObject({
      choice: 'flashing',
      choiceLabel: 'Flashing',
      text: '3 flashes',
    });
  });
});
