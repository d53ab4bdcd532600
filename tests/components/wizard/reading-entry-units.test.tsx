import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { ReadingEntry, type ReadingValue } from '@/components/wizard/reading-entry';
import { measureStepSchema, type MeasureStep } from '@/lib/trees/schema';

// Steps of our own, so these checks do not move when the default tree is revised. Demo bands.
// Parsed through the tree schema, so they carry its defaults whatever shape it gives a step's energy.
function measure(id: string, quantity: MeasureStep['quantity'], bands: MeasureStep['bands']): MeasureStep {
  return measureStepSchema.parse({ id, title: id, energy: 'any', kind: 'measure', quantity, points: ['A', 'B'], bands });
}
const continuity = measure('switch-continuity', 'ohm', [
  { to: 2, label: 'Closed', verdict: 'within', outcome: 'next' },
  { from: 2, label: 'Open (OL) or high', verdict: 'above', outcome: 'open' },
]);
const gap = measure('gap', 'length', [
  { to: 0.09375, label: 'Too close', verdict: 'below', outcome: 'a' },
  { from: 0.09375, to: 0.15625, label: 'About 1/8 in', verdict: 'within', outcome: 'b' },
  { from: 0.15625, label: 'Too wide', verdict: 'above', outcome: 'c' },
]);
const line = measure('line', 'vac', [
  { to: 108, label: 'Low', verdict: 'below', outcome: 'a' },
  { from: 108, to: 132, label: 'Normal', verdict: 'within', outcome: 'b' },
  { from: 132, label: 'High', verdict: 'above', outcome: 'c' },
]);

function Harness({
  step,
  unit,
  text = '',
  onValue,
}: {
  step: MeasureStep;
  unit: string;
  text?: string;
  onValue?: (v: ReadingValue) => void;
}) {
  const [value, setValue] = useState<ReadingValue>({ text, unit });
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

const olKey = () => screen.queryByRole('button', { name: 'OL, open circuit (over range)' });

describe('reading entry: OL on an ohms step', () => {
  it('has an OL key on ohms steps only', () => {
    const { unmount } = render(<Harness step={continuity} unit="Ω" />);
    expect(olKey()).toBeInTheDocument();
    unmount();
    render(<Harness step={line} unit="VAC" />);
    expect(olKey()).toBeNull();
  });

  it('the OL key enters an open circuit: shown as "OL (open circuit)", in the band open above', async () => {
    const user = userEvent.setup();
    let last: ReadingValue | undefined;
    render(<Harness step={continuity} unit="Ω" onValue={(v) => (last = v)} />);
    await user.click(olKey()!);
    expect(screen.getByLabelText('Reading')).toHaveValue('OL');
    expect(last).toEqual({ text: 'OL', unit: 'Ω' });
    expect(screen.getByTestId('parse-feedback')).toHaveTextContent('Reads as OL (open circuit)');
    const verdict = screen.getByTestId('gauge-verdict');
    expect(verdict).toHaveTextContent('OL (open circuit)');
    expect(verdict).toHaveAttribute('data-verdict', 'above');
    expect(verdict).toHaveTextContent('Open (OL) or high');
    // At the right-hand end of the gauge, beyond its scale.
    expect(screen.getByTestId('gauge-marker')).toHaveAttribute('data-position', '1.000');
    expect(screen.getByRole('img')).toHaveAccessibleName(
      /OL \(open circuit\) — Above: Open \(OL\) or high \(2 Ω and up\) \(beyond the end of the scale\)/,
    );
  });

  it('takes "open" typed on the keyboard too', async () => {
    const user = userEvent.setup();
    render(<Harness step={continuity} unit="Ω" />);
    await user.type(screen.getByLabelText('Reading'), 'open');
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('OL (open circuit)');
    expect(screen.getByLabelText('Reading')).toHaveAttribute('aria-invalid', 'false');
  });

  it('a digit after OL starts a new number instead of making "OL5"', async () => {
    const user = userEvent.setup();
    render(<Harness step={continuity} unit="Ω" />);
    await user.click(olKey()!);
    await user.click(screen.getByRole('button', { name: '5' }));
    expect(screen.getByLabelText('Reading')).toHaveValue('5');
    expect(screen.getByTestId('gauge-verdict')).toHaveAttribute('data-verdict', 'above');
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('5 Ω');
  });

  it('refuses OL on a voltage step with a clear message and draws no gauge', async () => {
    const user = userEvent.setup();
    let last: ReadingValue | undefined;
    render(<Harness step={line} unit="VAC" onValue={(v) => (last = v)} />);
    await user.type(screen.getByLabelText('Reading'), 'OL');
    expect(screen.getByTestId('parse-feedback')).toHaveTextContent('OL is only for resistance');
    expect(screen.getByLabelText('Reading')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.queryByTestId('band-gauge')).toBeNull();
    // What was typed is kept, so it can be corrected.
    expect(last).toEqual({ text: 'OL', unit: 'VAC' });
  });
});

describe('reading entry: units, hints and precision', () => {
  it('offers inches and mm for a spark gap, never feet', () => {
    render(<Harness step={gap} unit="in" />);
    const units = screen.getAllByRole('radio').map((r) => r.textContent?.replace('✓', ''));
    expect(units).toEqual(['in', 'mm']);
  });

  it('keeps a unit already chosen on offer even when it does not fit the bands', () => {
    // e.g. a reading given back after a refusal, entered in cm.
    render(<Harness step={gap} unit="cm" />);
    const units = screen.getAllByRole('radio').map((r) => r.textContent?.replace('✓', ''));
    expect(units).toEqual(['in', 'mm', 'cm']);
    expect(screen.getByRole('radio', { name: /^cm/ })).toHaveAttribute('aria-checked', 'true');
  });

  it('hints at fractions on lengths only, and at OL on ohms only', () => {
    const first = render(<Harness step={gap} unit="in" />);
    expect(screen.getByTestId('parse-feedback')).toHaveTextContent('fractions like 1 1/8');
    first.unmount();
    const second = render(<Harness step={line} unit="VAC" />);
    expect(screen.getByTestId('parse-feedback')).not.toHaveTextContent(/fraction/i);
    expect(screen.getByTestId('parse-feedback')).not.toHaveTextContent(/OL/);
    second.unmount();
    render(<Harness step={continuity} unit="Ω" />);
    expect(screen.getByTestId('parse-feedback')).toHaveTextContent('OL is an open circuit');
    expect(screen.getByTestId('parse-feedback')).not.toHaveTextContent(/fraction/i);
  });

  it.each([
    ['120.4', '120.4 VAC'],
    ['120', '120 VAC'],
  ])('shows %s as typed: %s', async (typed, shown) => {
    const user = userEvent.setup();
    render(<Harness step={line} unit="VAC" />);
    await user.type(screen.getByLabelText('Reading'), typed);
    expect(screen.getByTestId('parse-feedback')).toHaveTextContent(`Reads as ${shown}`);
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent(shown);
    expect(screen.getByTestId('gauge-verdict')).not.toHaveTextContent(`${typed}.0`);
  });
});
