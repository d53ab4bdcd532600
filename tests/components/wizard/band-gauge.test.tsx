import { render, screen } from '@testing-library/react';
import { BandGauge } from '@/components/wizard/band-gauge';
import type { MeasureStep } from '@/lib/trees/schema';

// Bands of our own with the first built-in tree's values (demo values), so the checks do not move
// when the built-in tree is revised.
type GaugeStep = Pick<MeasureStep, 'id' | 'bands' | 'quantity'>;
const secondary: GaugeStep = {
  id: 'transformer-secondary',
  quantity: 'vac',
  bands: [
    { to: 18, label: 'Low or no 24 V', verdict: 'below', outcome: 'a' },
    { from: 18, to: 30, label: 'Normal 24 V', verdict: 'within', outcome: 'b' },
    { from: 30, label: 'High', verdict: 'above', outcome: 'c' },
  ],
};
const manifold: GaugeStep = {
  id: 'manifold-pressure',
  quantity: 'pressure',
  bands: [
    { to: 0.5, label: 'No outlet pressure', verdict: 'below', outcome: 'a' },
    { from: 0.5, to: 3, label: 'Low manifold pressure', verdict: 'below', outcome: 'b' },
    { from: 3, to: 4, label: 'About 3.5 inWC', verdict: 'within', outcome: 'c' },
    { from: 4, label: 'High manifold pressure', verdict: 'above', outcome: 'd' },
  ],
};

function position() {
  return Number(screen.getByTestId('gauge-marker').getAttribute('data-position'));
}

describe('band gauge', () => {
  // The demo transformer-secondary bands: under 18 V below, 18–30 V within, 30 V and up above.
  it.each([
    [5, 'below', 'Below'],
    [24, 'within', 'Within'],
    [36, 'above', 'Above'],
  ] as const)('puts %s VAC %s, in words and with an icon', (value, verdict, word) => {
    render(<BandGauge step={secondary} value={value} unit="VAC" />);
    const line = screen.getByTestId('gauge-verdict');
    expect(line).toHaveAttribute('data-verdict', verdict);
    expect(line).toHaveTextContent(word);
    const band = secondary.bands.find((b) => b.verdict === verdict)!;
    expect(line).toHaveTextContent(band.label);
    expect(line).toHaveTextContent({ below: '▼', within: '●', above: '▲' }[verdict]);
  });

  it('places the marker by value: left of the band for a low reading, right for a high one', () => {
    const { unmount } = render(<BandGauge step={secondary} value={5} />);
    const low = position();
    unmount();
    const second = render(<BandGauge step={secondary} value={24} />);
    const mid = position();
    second.unmount();
    render(<BandGauge step={secondary} value={36} />);
    const high = position();
    expect(low).toBeLessThan(mid);
    expect(mid).toBeLessThan(high);
    // gaugeScale pads the 18–30 V span by half of it each side: 12 V to 36 V, so 24 V sits in the middle.
    expect(mid).toBeCloseTo(0.5, 3);
  });

  it('gives a text equivalent naming the reading, the verdict and the band range', () => {
    render(<BandGauge step={manifold} value={3.5} unit="inWC" caption="This reading" />);
    const img = screen.getByRole('img');
    expect(img).toHaveAccessibleName(/3\.5 inWC — Within: .+ \(3 inWC to 4 inWC\)/);
  });

  it('lists every band and marks the one the reading is in', () => {
    render(<BandGauge step={manifold} value={0.2} unit="inWC" />);
    const items = screen.getByRole('list', { name: 'Bands' }).querySelectorAll('li');
    expect(items).toHaveLength(manifold.bands.length);
    expect(items[0]).toHaveTextContent('this reading');
    expect(items[1]).not.toHaveTextContent('this reading');
  });

  it('shows the reading in the unit picked', () => {
    render(<BandGauge step={manifold} value={3.5} unit="Pa" />);
    // 3.5 inWC × 249.0889 Pa/inWC (NIST SP 811, conventional inch of water) = 871.8 Pa.
    expect(screen.getByTestId('gauge-verdict')).toHaveTextContent('872 Pa');
  });
});
