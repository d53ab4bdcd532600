import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { ReadingEntry, type ReadingValue } from '@/components/wizard/reading-entry';
import { measureStepSchema, type MeasureStep } from '@/lib/trees/schema';

// A step of our own (demo bands); only the layout behaviour is under test here.
const secondary: MeasureStep = measureStepSchema.parse({
  id: 'transformer-secondary',
  title: 'Transformer secondary',
  energy: 'any',
  kind: 'measure',
  quantity: 'vac',
  points: ['R', 'C'],
  bands: [
    { to: 18, label: 'Low', verdict: 'below', outcome: 'a' },
    { from: 18, label: 'Normal', verdict: 'within', outcome: 'b' },
  ],
});

function Harness() {
  const [value, setValue] = useState<ReadingValue>({ text: '', unit: 'VAC' });
  return (
    <>
      <ReadingEntry step={secondary} value={value} onChange={setValue} />
      <div data-testid="action-bar" />
    </>
  );
}

describe('the gauge under the keypad', () => {
  const scrolled = vi.fn();
  let gaugeBottom = 0;

  beforeEach(() => {
    scrolled.mockReset();
    Element.prototype.scrollIntoView = scrolled;
    vi.spyOn(Element.prototype, 'getBoundingClientRect').mockImplementation(function (this: Element) {
      const height = this.getAttribute('data-testid') === 'action-bar' ? 80 : 0;
      const bottom = this.classList.contains('scroll-mb-4') ? gaugeBottom : height;
      return { top: 0, left: 0, right: 0, width: 0, x: 0, y: 0, height, bottom, toJSON: () => ({}) } as DOMRect;
    });
    window.innerHeight = 768;
  });
  afterEach(() => vi.restoreAllMocks());

  it('is scrolled into view once when it appears behind the action bar, not again on every key', async () => {
    gaugeBottom = 740; // 768 − 80 px of action bar: its lower part is hidden
    const user = userEvent.setup();
    render(<Harness />);
    await user.type(screen.getByLabelText('Reading'), '2');
    expect(scrolled).toHaveBeenCalledTimes(1);
    expect(scrolled).toHaveBeenCalledWith(expect.objectContaining({ block: 'end' }));
    await user.type(screen.getByLabelText('Reading'), '4.1');
    expect(scrolled).toHaveBeenCalledTimes(1);
  });

  it('stays put when the gauge is already in view', async () => {
    gaugeBottom = 500;
    const user = userEvent.setup();
    render(<Harness />);
    await user.type(screen.getByLabelText('Reading'), '24');
    expect(screen.getByText('This reading')).toBeInTheDocument();
    expect(scrolled).not.toHaveBeenCalled();
  });
});
