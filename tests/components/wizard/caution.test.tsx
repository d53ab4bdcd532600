import { render, screen } from '@testing-library/react';
import { Caution, withDeferral } from '@/components/ui/caution';

describe('caution box', () => {
  it.each([
    ['DANGER', true],
    ['WARNING', true],
    ['CAUTION', true],
    ['NOTICE', false],
  ] as const)('shows %s as its signal word, with the safety-alert symbol: %s', (signal, symbol) => {
    render(<Caution signal={signal} text="Keep clear of the burner." />);
    const box = screen.getByRole('note', { name: signal });
    expect(box).toHaveTextContent(signal);
    // ANSI Z535.4: the safety-alert symbol goes with the personal-injury signal words, not NOTICE.
    expect(box.textContent?.includes('⚠')).toBe(symbol);
  });

  it('ends with the deferral to codes, instructions and licensed practice', () => {
    render(<Caution signal="WARNING" text="Line voltage at the terminals." />);
    expect(screen.getByRole('note')).toHaveTextContent(
      "Line voltage at the terminals. Follow local codes, the equipment manufacturer's instructions and licensed practice.",
    );
  });

  it('does not repeat the deferral when the text already has it', () => {
    const text = "Find the cause first. Follow local codes, the equipment manufacturer's instructions and licensed practice.";
    expect(withDeferral(text)).toBe(text);
  });

  it('can announce itself as an alert', () => {
    render(<Caution signal="DANGER" text="Rollout switch tripped." role="alert" />);
    expect(screen.getByRole('alert')).toHaveTextContent('DANGER');
  });
});
