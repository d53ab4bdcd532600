import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { PathSoFar, readingText } from '@/components/wizard/path-so-far';
import { WhyThisStep } from '@/components/wizard/step-parts';
import { UndoLast } from '@/components/wizard/undo-last';
import type { PathItem } from '@/machines/wizard-machine';

const item = (over: Partial<PathItem>): PathItem => ({
  clientId: crypto.randomUUID(),
  stepId: 's',
  stepTitle: 'A step',
  kind: 'measure',
  saved: true,
  ...over,
});

describe('path so far: readings as entered', () => {
  it.each([
    [{ quantity: 'vac', text: '120.4', unit: 'VAC' }, '120.4 VAC'],
    [{ quantity: 'vac', text: '120', unit: 'VAC' }, '120 VAC'],
    [{ quantity: 'length', text: '1 1/8', unit: 'in' }, '1 1/8 in'],
    [{ quantity: 'length', text: '3.2', unit: 'mm' }, '3.2 mm'],
    [{ quantity: 'pressure', text: '3,5', unit: 'inWC' }, '3.5 inWC'],
    [{ quantity: 'ohm', text: 'OL', unit: 'Ω', overRange: true }, 'OL (open circuit)'],
  ] as const)('%o shows as %s', (over, shown) => {
    expect(readingText(over)).toBe(shown);
  });

  it('shows text it cannot parse as stored rather than losing it', () => {
    expect(readingText({ quantity: 'vac', text: 'about 24', unit: 'VAC' })).toBe('about 24 VAC');
    expect(readingText({ text: '24', unit: 'VAC' })).toBe('24 VAC');
  });

  it('lists the answers with their verdicts', () => {
    render(
      <PathSoFar
        items={[
          item({ quantity: 'vac', text: '120.4', unit: 'VAC', value: 120.4, verdict: 'within', band: 'Normal' }),
          item({ quantity: 'ohm', text: 'OL', unit: 'Ω', overRange: true, verdict: 'above', band: 'Open', saved: false }),
        ]}
      />,
    );
    const rows = screen.getByTestId('path-so-far').querySelectorAll('li');
    expect(rows[0]).toHaveTextContent('120.4 VAC');
    expect(rows[0]).toHaveTextContent('Within — Normal');
    expect(rows[1]).toHaveTextContent('OL (open circuit)');
    expect(rows[1]).toHaveTextContent('Above — Open');
    expect(rows[1]).toHaveTextContent('(not saved yet)');
  });
});

describe('undo last', () => {
  it('offers undo behind a confirmation', async () => {
    const user = userEvent.setup();
    const onUndo = vi.fn();
    render(<UndoLast lastTitle="Line voltage" disabled={false} onUndo={onUndo} />);
    await user.click(screen.getByRole('button', { name: /Undo last answer/ }));
    await user.click(screen.getByRole('button', { name: 'Undo it' }));
    expect(onUndo).toHaveBeenCalledTimes(1);
  });

  it('is not offered when locked, and says why', () => {
    const onUndo = vi.fn();
    render(
      <UndoLast
        lastTitle="Line voltage"
        disabled={false}
        onUndo={onUndo}
        lockedReason="The call is closed: its answers stay as they are."
      />,
    );
    expect(screen.queryByRole('button')).toBeNull();
    expect(screen.getByTestId('undo-locked')).toHaveTextContent('The call is closed');
  });
});

describe('why this step', () => {
  it('is closed by default and open when asked', () => {
    const first = render(<WhyThisStep why="Because." />);
    expect(screen.getByTestId('why-this-step')).not.toHaveAttribute('open');
    first.unmount();
    render(<WhyThisStep why="Because." defaultOpen />);
    expect(screen.getByTestId('why-this-step')).toHaveAttribute('open');
  });

  it('renders nothing without a note', () => {
    const { container } = render(<WhyThisStep defaultOpen />);
    expect(container).toBeEmptyDOMElement();
  });
});

describe('wizard layout rules in the source', () => {
  const dir = join(process.cwd(), 'components/wizard');
  // finding-screen.tsx is being reworked (repair, restore, verify) and follows the same rule there.
  const files = readdirSync(dir).filter((f) => f.endsWith('.tsx') && f !== 'finding-screen.tsx');

  it.each(files)('%s sets no text below 16 px (text-sm, text-xs) and no height under the touch size on buttons', (file) => {
    const source = readFileSync(join(dir, file), 'utf8');
    expect(source).not.toMatch(/\btext-(xs|sm)\b/);
    expect(source).not.toMatch(/\bmin-h-0\b/);
    // The shared .label class is 14 px: the wizard raises it to 16 px wherever it uses it.
    expect(source).not.toMatch(/className="label"/);
  });
});
