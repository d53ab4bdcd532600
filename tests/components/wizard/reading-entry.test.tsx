import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { ReadingEntry, type ReadingValue } from '@/components/wizard/reading-entry';
import { measureStepSchema, type MeasureStep } from '@/lib/trees/schema';

// Steps of our own with the first built-in tree's bands (demo values), so the checks do not move
// when the built-in tree is revised; parsed through the schema for its defaults.
const gap: MeasureStep = measureStepSchema.parse({
  id: 'spark-gap',
  title: 'Spark gap',
  energy: 'any',
  kind: 'measure',
  quantity: 'length',
  points: ['Spark rod', 'Ground rod'],
  bands: [
    { to: 0.09, label: 'Too close', verdict: 'below', outcome: 'a' },
    { from: 0.09, to: 0.16, label: 'About 1/8 in', verdict: 'within', outcome: 'b' },
    { from: 0.16, label: 'Too wide', verdict: 'above', outcome: 'c' },
  ],
});
const secondary: MeasureStep = measureStepSchema.parse({
  id: 'transformer-secondary',
  title: 'Transformer secondary',
  energy: 'any',
  kind: 'measure',
  quantity: 'vac',
  points: ['R', 'C'],
  bands: [
    { to: 18, label: 'Low or no 24 V', verdict: 'below', outcome: 'a' },
    { from: 18, to: 30, label: 'Normal 24 V', verdict: 'within', outcome: 'b' },
    { from: 30, label: 'High', verdict: 'above', outcome: 'c' },
  ],
});

function Harness({ step, unit, onValue }: { step: MeasureStep; unit: string; onValue?: (v: ReadingValue) => void }) {
  const [value, setValue] = useState<ReadingValue>({ text: '', unit });
  return (
    <ReadingEntry
      step={step}
      value={value}
      onChange={(v) => {
        setValue(v);
        onValue?.(v);
      }}
    />
  );
}

describe('reading entry: keypad and unit picker', () => {
  it('types a mixed fraction on the keypad and shows it on the gauge', async () => {
    const user = userEvent.setup();
    render(<Harness step={gap} unit="in" />);
    for (const key of ['1', 'Space', '1', 'Fraction slash', '8']) {
      await user.click(screen.getByRole('button', { name: key }));
    }
    expect(screen.getByLabelText('Reading')).toHaveValue('1 1/8');
    // 1 1/8 in is far above the demo spark-gap band (0.09 to 0.16 in).
    expect(screen.getByTestId('gauge-verdict')).toHaveAttribute('data-verdict', 'above');
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('Above');
  });

  it('backspace removes the last character', async () => {
    const user = userEvent.setup();
    render(<Harness step={gap} unit="in" />);
    await user.click(screen.getByRole('button', { name: '1' }));
    await user.click(screen.getByRole('button', { name: '2' }));
    await user.click(screen.getByRole('button', { name: 'Backspace' }));
    expect(screen.getByLabelText('Reading')).toHaveValue('1');
  });

  it('reads a value in the unit picked: 3.2 mm is within the spark-gap band', async () => {
    const user = userEvent.setup();
    let last: ReadingValue | undefined;
    render(<Harness step={gap} unit="in" onValue={(v) => (last = v)} />);
    await user.click(screen.getByRole('radio', { name: /^mm/ }));
    expect(screen.getByRole('radio', { name: /^mm/ })).toHaveAttribute('aria-checked', 'true');
    await user.type(screen.getByLabelText('Reading'), '3.2');
    expect(last).toEqual({ text: '3.2', unit: 'mm' });
    // 3.2 mm = 0.126 in (25.4 mm per inch, NIST SP 811), inside 0.09–0.16 in.
    expect(screen.getByTestId('gauge-verdict')).toHaveAttribute('data-verdict', 'within');
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('3.2 mm');
  });

  it('offers only the units that fit the step and takes the keyboard too (inputmode decimal)', async () => {
    render(<Harness step={secondary} unit="VAC" />);
    // 24 V bands: volts only, no millivolts (lib/units unitsForStep), so no picker to choose from.
    expect(screen.queryByRole('radiogroup', { name: 'Unit' })).toBeNull();
    expect(screen.getByLabelText('Unit')).toHaveTextContent('VAC');
    expect(screen.getByLabelText('Reading')).toHaveAttribute('inputmode', 'decimal');
    // No fraction keys for volts.
    expect(screen.queryByRole('button', { name: 'Fraction slash' })).toBeNull();
  });

  it('says why a value is refused, with the same parser as the server', async () => {
    const user = userEvent.setup();
    render(<Harness step={secondary} unit="VAC" />);
    await user.type(screen.getByLabelText('Reading'), '24 kPa');
    expect(screen.getByTestId('parse-feedback')).toHaveTextContent('kPa is a pressure unit, this step measures AC volts');
    expect(screen.getByLabelText('Reading')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.queryByTestId('band-gauge')).toBeNull();
  });

  it('moves through the unit picker with the arrow keys', async () => {
    const user = userEvent.setup();
    render(<Harness step={gap} unit="in" />);
    screen.getByRole('radio', { name: /^in/ }).focus();
    await user.keyboard('{ArrowRight}');
    expect(screen.getByRole('radio', { name: /^mm/ })).toHaveAttribute('aria-checked', 'true');
    expect(screen.getByRole('radio', { name: /^mm/ })).toHaveFocus();
  });
});
