import { render, screen } from '@testing-library/react';
import { BandGauge } from '@/components/wizard/band-gauge';
import type { MeasureStep } from '@/lib/trees/schema';

// Demo bands of our own: a gap judged against 3/32 in and 5/32 in (about 1/8 in ± 1/32 in is common practice, no source).
const gap: Pick<MeasureStep, 'id' | 'bands' | 'quantity'> = {
  id: 'gap',
  quantity: 'length',
  bands: [
    { to: 3 / 32, label: 'Too close', verdict: 'below', outcome: 'a' },
    { from: 3 / 32, to: 5 / 32, label: 'About 1/8 in', verdict: 'within', outcome: 'b' },
    { from: 5 / 32, label: 'Too wide', verdict: 'above', outcome: 'c' },
  ],
};
const line: Pick<MeasureStep, 'id' | 'bands' | 'quantity'> = {
  id: 'line',
  quantity: 'vac',
  bands: [
    { to: 108, label: 'Low', verdict: 'below', outcome: 'a' },
    { from: 108, to: 132, label: 'Normal', verdict: 'within', outcome: 'b' },
    { from: 132, label: 'High', verdict: 'above', outcome: 'c' },
  ],
};

const ticks = () => screen.getAllByTestId('gauge-tick').map((t) => t.textContent);

describe('band gauge: in the unit and the form the reading was entered in', () => {
  it('a reading typed as a fraction of an inch: fraction ticks', () => {
    render(<BandGauge step={gap} value={0.125} unit="in" form={{ fraction: true, decimals: null }} />);
    expect(ticks()).toEqual(['3/32', '5/32']);
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('1/8 in');
    expect(screen.getByRole('list', { name: 'Bands' })).toHaveTextContent('3/32 in to 5/32 in');
  });

  it('a reading typed in decimal inches: decimal ticks, the value to its typed decimals', () => {
    render(<BandGauge step={gap} value={0.125} unit="in" form={{ fraction: false, decimals: 3 }} />);
    // 3/32 = 0.09375 and 5/32 = 0.15625, to three significant figures.
    expect(ticks()).toEqual(['0.0938', '0.156']);
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('0.125 in');
  });

  it('a reading typed in mm: ticks in mm', () => {
    render(<BandGauge step={gap} value={3.2 / 25.4} unit="mm" form={{ fraction: false, decimals: 1 }} />);
    // 25.4 mm per inch exactly (NIST SP 811, Appendix B): 3/32 in = 2.38125 mm, 5/32 in = 3.96875 mm.
    expect(ticks()).toEqual(['2.38', '3.97']);
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('3.2 mm');
    expect(screen.getByTestId('gauge-verdict')).toHaveAttribute('data-verdict', 'within');
  });

  it.each([
    [120.4, 1, '120.4 VAC'],
    [120, 0, '120 VAC'],
  ])('shows %s VAC to the precision typed (%s decimals): %s', (value, decimals, shown) => {
    render(<BandGauge step={line} value={value} unit="VAC" form={{ fraction: false, decimals }} />);
    expect(screen.getByTestId('gauge-verdict').querySelector('.font-mono')).toHaveTextContent(new RegExp(`^${shown}$`));
  });

  it('an over-range reading sits at the top end, in the band open above', () => {
    const ohms: Pick<MeasureStep, 'id' | 'bands' | 'quantity'> = {
      id: 'ohms',
      quantity: 'ohm',
      bands: [
        { to: 2, label: 'Closed', verdict: 'within', outcome: 'a' },
        { from: 2, label: 'Open', verdict: 'above', outcome: 'b' },
      ],
    };
    render(<BandGauge step={ohms} overRange unit="Ω" />);
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('OL (open circuit)');
    expect(screen.getByTestId('gauge-verdict')).toHaveAttribute('data-verdict', 'above');
    expect(screen.getByTestId('gauge-marker')).toHaveAttribute('data-position', '1.000');
    const items = screen.getByRole('list', { name: 'Bands' }).querySelectorAll('li');
    expect(items[1]).toHaveTextContent('this reading');
    expect(items[0]).not.toHaveTextContent('this reading');
  });
});
